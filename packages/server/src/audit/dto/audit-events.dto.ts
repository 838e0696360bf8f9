import { ApiProperty, ApiPropertyOptional, getSchemaPath } from '@nestjs/swagger';
import type { AuditEvent, StoredCopyDifference } from '../audit.service';

/** The audit begins: how many lots it will check. */
export class AuditStartEvent {
  @ApiProperty({ enum: ['start'] }) type: 'start';
  @ApiProperty() lots: number;
  @ApiProperty() startedAt: string;
}

/** How far the audit has come. */
export class AuditProgressEvent {
  @ApiProperty({ enum: ['progress'] }) type: 'progress';
  @ApiProperty() lotsChecked: number;
  @ApiProperty() lots: number;
  @ApiProperty() entriesChecked: number;
}

/** One stored value that differs from what the roll says. */
export class StoredCopyDifferenceResponse implements StoredCopyDifference {
  @ApiProperty() table: string;
  @ApiProperty() column: string;
  @ApiProperty({ type: Number, nullable: true, description: 'the entry; null for a value of the lot' })
  seq: number | null;
  @ApiProperty() stored: string;
  @ApiProperty() roll: string;
}

/** A lot whose roll, links or stored copies do not hold up, and the first reason. */
export class AuditBrokenEvent {
  @ApiProperty({ enum: ['broken'] }) type: 'broken';
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() reason: string;
  @ApiProperty() message: string;
  @ApiPropertyOptional({
    type: [StoredCopyDifferenceResponse],
    description: 'for the reason stored-copy: each stored value that differs from the roll',
  })
  differences?: StoredCopyDifferenceResponse[];
}

/** The audit's end. */
export class AuditDoneEvent {
  @ApiProperty({ enum: ['done'] }) type: 'done';
  @ApiProperty() lotsChecked: number;
  @ApiProperty() entriesChecked: number;
  @ApiProperty() broken: number;
  @ApiProperty() ok: boolean;
  @ApiProperty() finishedAt: string;
}

export const AUDIT_EVENTS = [AuditStartEvent, AuditProgressEvent, AuditBrokenEvent, AuditDoneEvent];

/** The schema of one line of the audit's stream: one of the events, told apart by `type`. */
export const AUDIT_EVENT_SCHEMA = {
  oneOf: AUDIT_EVENTS.map((e) => ({ $ref: getSchemaPath(e) })),
  discriminator: {
    propertyName: 'type',
    mapping: {
      start: getSchemaPath(AuditStartEvent),
      progress: getSchemaPath(AuditProgressEvent),
      broken: getSchemaPath(AuditBrokenEvent),
      done: getSchemaPath(AuditDoneEvent),
    },
  },
};

// The classes describe every event the service yields.
export type AuditEventResponse = AuditStartEvent | AuditProgressEvent | AuditBrokenEvent | AuditDoneEvent;
const _sameShape: (e: AuditEvent) => AuditEventResponse = (e) => e;
void _sameShape;
