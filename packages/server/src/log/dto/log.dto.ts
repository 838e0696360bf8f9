import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches, MaxLength } from 'class-validator';

const WHOLE = /^(0|[1-9][0-9]{0,14})$/;
const WHOLE_MESSAGE = 'must be a whole number 0 or more, written in digits';

/** A log size or index as written in a query: decimal digits, no sign, no leading zeros. */
function LogNumber(): PropertyDecorator {
  return (target, key) => {
    ApiProperty({ type: String, pattern: WHOLE.source })(target, key);
    IsString({ message: WHOLE_MESSAGE })(target, key);
    Matches(WHOLE, { message: WHOLE_MESSAGE })(target, key);
  };
}

export class InclusionQueryDto {
  @LogNumber() index: string;
  @LogNumber() size: string;
}

export class ConsistencyQueryDto {
  @LogNumber() from: string;
  @LogNumber() to: string;
}

export class LeavesQueryDto {
  @LogNumber() start: string;
  @LogNumber() end: string;
}

export class CosignatureDto {
  @ApiProperty({ description: 'The checkpoint note the witness was served and cosigned' })
  @IsString()
  @MaxLength(20_000, { message: 'must be at most 20000 characters' })
  checkpoint: string;

  @ApiProperty({ description: 'The witness’s signature line (C2SP tlog-cosignature)' })
  @IsString()
  @MaxLength(1000, { message: 'must be at most 1000 characters' })
  cosignature: string;
}

export class RegisterWitnessDto {
  @ApiProperty({ description: 'The witness’s verifier key: name+keyid+base64(0x04 ‖ Ed25519 public key)' })
  @IsString()
  @MaxLength(300, { message: 'must be at most 300 characters' })
  key: string;
}
