import { Transform } from 'class-transformer';
import { IsString, MaxLength, MinLength } from 'class-validator';
import { stacked } from './stacked';

/** Strips the spaces a pasted value brings at either end; leaves non-strings for the validators. */
export const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

/** At least this many characters, with the words the dealer reads when there are fewer. */
export interface Least {
  length: number;
  message: string;
}

/** Text trimmed at both ends, at most `max` characters, and at least `least.length` when given. */
export const TrimmedText = (max: number, least?: Least) =>
  stacked(
    Transform(trim),
    IsString(),
    ...(least ? [MinLength(least.length, { message: least.message })] : []),
    MaxLength(max, { message: `must be at most ${max} characters` }),
  );

/** A reason a person writes for a decision (it reaches the other side): 3 to `max` characters. */
export const Reason = (max: number) =>
  TrimmedText(max, { length: 3, message: 'must say why, in at least 3 characters' });
