import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { ArrayMaxSize, ArrayMinSize, IsArray, IsUUID } from 'class-validator';

const MAX_IDS = 100;

/** Account ids whose public cards are wanted, comma-separated (as they appear on rolls). */
export class DealerCardsQueryDto {
  @ApiProperty({ type: String, description: `up to ${MAX_IDS} account ids, comma-separated` })
  @Transform(({ value }: { value: unknown }) =>
    typeof value === 'string' ? value.split(',').filter((s) => s.length > 0) : value,
  )
  @IsArray({ message: 'must be a comma-separated list of account ids' })
  @ArrayMinSize(1, { message: 'must name at least one account id' })
  @ArrayMaxSize(MAX_IDS, { message: `must name at most ${MAX_IDS} account ids` })
  @IsUUID('all', { each: true, message: 'must hold only account ids' })
  ids: string[];
}
