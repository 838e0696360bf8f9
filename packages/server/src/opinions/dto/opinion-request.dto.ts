import { PartyName } from '../../accounts/dto/dealer-card.dto';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsOptional, IsString, IsUUID, MaxLength, MinLength } from 'class-validator';
import { PageQueryDto } from '../../common/page-query.dto';
import { Page } from '../../common/page.dto';
import { trim } from '../../common/text-fields';

/** Asks a named assessor, or any verified assessor, for an opinion on a lot the dealer holds. */
export class CreateOpinionRequestDto {
  @ApiProperty({ description: 'lot code, with or without hyphens', example: '7K2Q-M9XA-T' })
  @IsString({ message: 'lot must be a lot code such as 7K2Q-M9XA-T' })
  @MaxLength(20, { message: 'lot must be a lot code such as 7K2Q-M9XA-T' })
  lot: string;

  @ApiPropertyOptional({ description: 'account id of a verified assessor; omitted: any verified assessor' })
  @IsOptional()
  @IsUUID('all', { message: 'assessor must be an assessor chosen from the list, or leave it empty for any' })
  assessor?: string;

  @ApiPropertyOptional({ maxLength: 2000, description: 'what to look at; seen by the assessor only' })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MinLength(1, { message: 'note must not be empty; leave it out instead' })
  @MaxLength(2000, { message: 'note must be at most 2,000 characters' })
  note?: string;
}

export const REQUEST_BOXES = ['sent', 'received'] as const;

/** The holder's sent requests, or an assessor's queue. */
export class ListOpinionRequestsQueryDto extends PageQueryDto {
  @ApiProperty({ enum: REQUEST_BOXES })
  @IsIn(REQUEST_BOXES, { message: 'box must be sent or received' })
  box: (typeof REQUEST_BOXES)[number];
}

/** Finds verified assessors by name, handle or business. */
export class AssessorSearchQueryDto {
  @ApiPropertyOptional({ maxLength: 100 })
  @IsOptional()
  @IsString()
  @MaxLength(100)
  q?: string;
}

class RequestLot {
  @ApiProperty() code: string;
  @ApiProperty() displayCode: string;
  @ApiProperty() title: string;
  @ApiProperty() listed: boolean;
}

/** One opinion request. */
export class OpinionRequestResponse {
  @ApiProperty() id: string;
  @ApiProperty({ type: RequestLot }) lot: RequestLot;
  @ApiProperty({ type: PartyName }) requester: PartyName;
  @ApiProperty({ type: PartyName, nullable: true, description: 'null: any verified assessor' })
  assessor: PartyName | null;
  @ApiProperty({ nullable: true }) note: string | null;
  @ApiProperty({ enum: ['open', 'answered', 'cancelled'] }) status: 'open' | 'answered' | 'cancelled';
  @ApiProperty() createdAt: string;
  @ApiProperty({ nullable: true }) closedAt: string | null;
  @ApiProperty({ nullable: true, description: 'the seq of the opinion that answered it' })
  opinionSeq: number | null;
  @ApiProperty({ nullable: true, type: PartyName }) answeredBy: PartyName | null;
}

export class OpinionRequestListResponse extends Page(OpinionRequestResponse) {}

export class AssessorListResponse {
  @ApiProperty({ type: [PartyName] }) items: PartyName[];
}
