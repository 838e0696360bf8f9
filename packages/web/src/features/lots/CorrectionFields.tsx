import { LIMITS } from '@beadroll/core';
import { Checkbox, Field, Select, Textarea } from '@fluentui/react-components';

/** What a correction names: the earlier entry and why it was wrong (empty = not a correction). */
export interface CorrectionDraft {
  on: boolean;
  seq: string;
  reason: string;
}

export const NO_CORRECTION: CorrectionDraft = { on: false, seq: '', reason: '' };

/** The request's `corrects`, or a message for the field that is missing. */
export function correctionOf(c: CorrectionDraft): {
  corrects?: { seq: number; reason: string };
  problem?: string;
} {
  if (!c.on) return {};
  if (!c.reason.trim()) return { problem: 'Say what was wrong, so a reader knows why it was corrected.' };
  return { corrects: { seq: Number(c.seq), reason: c.reason.trim() } };
}

/**
 * "This corrects an earlier entry": which one (`seqs`, newest first by default) and why. The
 * earlier entry stays on the roll; pages show it folded under the correction.
 */
export function CorrectionFields({
  value,
  onChange,
  seqs,
  what,
  error,
}: {
  value: CorrectionDraft;
  onChange: (v: CorrectionDraft) => void;
  seqs: readonly number[];
  what: string;
  error?: string;
}) {
  if (seqs.length === 0) return null;
  const newest = String(seqs[seqs.length - 1]);
  return (
    <>
      <Checkbox
        label={`This corrects an earlier ${what} that was wrong`}
        checked={value.on}
        onChange={(_, d) => onChange({ ...value, on: d.checked === true, seq: value.seq || newest })}
      />
      {value.on ? (
        <>
          <Field label={`The ${what} it corrects`}>
            <Select value={value.seq || newest} onChange={(_, d) => onChange({ ...value, seq: d.value })}>
              {[...seqs].reverse().map((s) => (
                <option key={s} value={String(s)}>
                  Entry {s}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="What was wrong" required validationMessage={error}>
            <Textarea
              value={value.reason}
              maxLength={LIMITS.longText}
              onChange={(_, d) => onChange({ ...value, reason: d.value })}
              resize="vertical"
            />
          </Field>
        </>
      ) : null}
    </>
  );
}
