import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import { stacked } from '../../common/stacked';
import { trim } from '../../common/text-fields';

// Length is what makes a password strong; no composition rules (NIST SP 800-63B, section 5.1.1.2, from memory).
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 128;
export const PASSWORD_RULE = `must be ${PASSWORD_MIN} to ${PASSWORD_MAX} characters long`;

/** A password being chosen (sign-up, reset, change), documented and checked against the rule. */
export const NewPassword = () =>
  stacked(
    ApiProperty({ description: PASSWORD_RULE }),
    IsString(),
    MinLength(PASSWORD_MIN, { message: PASSWORD_RULE }),
    MaxLength(PASSWORD_MAX, { message: PASSWORD_RULE }),
  );

/** An account's e-mail address as typed into a form: trimmed, at most 254 characters (RFC 5321, section 4.5.3.1.3, from memory: a path holds at most 256 octets with its angle brackets). */
export const AccountEmail = () =>
  stacked(
    Transform(trim),
    IsEmail({}, { message: 'must be an e-mail address' }),
    MaxLength(254, { message: 'must be at most 254 characters' }),
  );
