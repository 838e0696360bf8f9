import { ApiProperty } from '@nestjs/swagger';
import type { StandbyStatus } from '../../standby/standby.service';

/** The hot standby public reads may use. */
export class StandbyStatusResponse implements StandbyStatus {
  @ApiProperty({ description: 'whether a standby is configured' }) configured: boolean;
  @ApiProperty({
    nullable: true,
    type: Number,
    description: 'replay lag in milliseconds (0 when it has replayed all it received); null when unknown',
  })
  lagMs: number | null;
  @ApiProperty({ description: 'true when public reads go to the standby now' }) usable: boolean;
}

/** How this server process and what it depends on are doing. */
export class HealthResponse {
  @ApiProperty({ enum: ['ok', 'degraded'] }) status: 'ok' | 'degraded';
  @ApiProperty({ description: 'this server process (its instance name)' }) instance: string;
  @ApiProperty({ enum: ['ok', 'unreachable'] }) database: 'ok' | 'unreachable';
  @ApiProperty({ enum: ['up to date', 'pending', 'unknown'] }) migrations:
    'up to date' | 'pending' | 'unknown';
  @ApiProperty({
    enum: ['ok', 'refusing'],
    description: 'refusing: the log’s signer found the log broken and signs no checkpoint until it is whole',
  })
  log: 'ok' | 'refusing';
  @ApiProperty({ type: StandbyStatusResponse }) standby: StandbyStatusResponse;
  @ApiProperty({ description: 'when this report was made (RFC 3339, UTC)' }) time: string;
  @ApiProperty({ type: [String], description: 'why the status is degraded, in words; empty when ok' })
  reasons: string[];
}
