import { Field, Select } from '@fluentui/react-components';

/**
 * A choice from a fixed list (one of core's lists, most often) in its labelled field: `options`
 * in their order, each shown in the words `labels` gives it.
 */
export function SelectField<T extends string>({
  label,
  hint,
  required,
  value,
  options,
  labels,
  onChange,
  disabled,
  validationMessage,
}: {
  label: string;
  hint?: string;
  required?: boolean;
  value: T;
  options: readonly T[];
  labels: Readonly<Record<T, string>> | ((value: T) => string);
  onChange: (value: T) => void;
  disabled?: boolean;
  validationMessage?: string;
}) {
  const words = typeof labels === 'function' ? labels : (v: T) => labels[v];
  return (
    <Field label={label} hint={hint} required={required} validationMessage={validationMessage}>
      <Select value={value} disabled={disabled} onChange={(_, d) => onChange(d.value as T)}>
        {options.map((o) => (
          <option key={o} value={o}>
            {words(o)}
          </option>
        ))}
      </Select>
    </Field>
  );
}
