import { useCallback, useState } from 'react';
import { fieldError } from './FormPage';

/** What a field component (`TextField`, `PasswordField`, `NoteField`, `SelectField`) takes from its form. */
export interface BoundField<V extends string = string> {
  value: V;
  onChange: (value: V) => void;
  validationMessage?: string;
}

/**
 * A form's text values, each kept under the name of the request field it is sent as. `bind(error)`
 * gives a function that hands one field component its value, its setter and the server's reason
 * against that request field in `error` (a failed request's 400), so each field names itself once.
 */
export function useFormValues<T extends Record<string, string>>(initial: T) {
  const [values, setValues] = useState<T>(initial);
  const set = useCallback(
    <K extends keyof T>(name: K, value: T[K]) => setValues((v) => ({ ...v, [name]: value })),
    [],
  );
  const reset = useCallback(() => setValues(initial), [initial]);
  const bind =
    (error: unknown) =>
    <K extends keyof T & string>(name: K): BoundField<T[K]> => ({
      value: values[name],
      onChange: (value) => set(name, value),
      validationMessage: fieldError(error, name),
    });
  return { values, set, reset, bind };
}
