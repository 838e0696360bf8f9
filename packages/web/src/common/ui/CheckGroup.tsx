import { Field, FieldContextProvider, type FieldProps } from '@fluentui/react-components';
import type { ReactNode } from 'react';

/**
 * Several checkboxes (or other controls) under one Field label and message. A Field hands its
 * own id to every control inside it, so each label would toggle the first box; here the Field
 * names and describes a `group` instead, and each control keeps its own id and label.
 */
export function CheckGroup({
  children,
  className,
  ...field
}: Omit<FieldProps, 'children'> & { children: ReactNode; className?: string }) {
  return (
    <Field {...field}>
      {(control) => (
        <div
          role="group"
          className={className}
          aria-labelledby={control['aria-labelledby']}
          aria-describedby={control['aria-describedby']}
          data-invalid={control['aria-invalid'] ? 'true' : undefined}
        >
          <FieldContextProvider value={undefined}>{children}</FieldContextProvider>
        </div>
      )}
    </Field>
  );
}
