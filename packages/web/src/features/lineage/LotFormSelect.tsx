import { Field, Select } from '@fluentui/react-components';
import { LOT_FORMS, type LotForm } from '@beadroll/core';

/** The form (strand, necklace…) of a new lot, in a labelled drop-down. */
export function LotFormSelect({ value, onChange }: { value: LotForm; onChange: (f: LotForm) => void }) {
  return (
    <Field label="Form">
      <Select value={value} onChange={(_e, d) => onChange(d.value as LotForm)}>
        {LOT_FORMS.map((f) => (
          <option key={f} value={f}>
            {f}
          </option>
        ))}
      </Select>
    </Field>
  );
}
