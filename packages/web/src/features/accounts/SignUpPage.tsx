import { Field, Input, Radio, RadioGroup, Textarea } from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { accountsApi } from './accounts.api';
import { fieldError, RequestFormPage } from '../../common/ui/FormPage';

const FIELDS = [
  { name: 'displayName', label: 'Your name', autoComplete: 'name', hint: 'Shown on your dealer card.' },
  {
    name: 'handle',
    label: 'Handle',
    autoComplete: 'username',
    hint: 'Lower-case letters, digits and hyphens; part of your public address. It can never be changed.',
  },
  { name: 'business', label: 'Business name', autoComplete: 'organization' },
  {
    name: 'address',
    label: 'Business address',
    autoComplete: 'street-address',
    hint: 'Street, number and town. Only the registrar sees it.',
  },
  { name: 'town', label: 'Town', autoComplete: 'address-level2' },
  { name: 'country', label: 'Country', autoComplete: 'country-name' },
  {
    name: 'website',
    label: 'Website (optional)',
    autoComplete: 'url',
    type: 'url' as const,
    optional: true,
    hint: 'Starting with https://',
  },
  { name: 'email', label: 'E-mail address', autoComplete: 'email', type: 'email' as const },
  {
    name: 'password',
    label: 'Password',
    autoComplete: 'new-password',
    type: 'password' as const,
    hint: 'At least 12 characters. A few unrelated words make a good one.',
  },
];

/** The largest document the service takes with an application (10 MB), and its types. */
const DOCUMENT_MAX_BYTES = 10 * 1024 * 1024;
const DOCUMENT_TYPES = ['application/pdf', 'image/jpeg', 'image/png'];

/** Why a chosen document would be refused, in the service's words, or undefined. */
function documentProblem(file: File | null): string | undefined {
  if (!file) return undefined;
  if (!DOCUMENT_TYPES.includes(file.type)) return 'must be a PDF, JPEG or PNG file';
  if (file.size === 0) return 'is empty: choose another file';
  if (file.size > DOCUMENT_MAX_BYTES) return 'is too large: at most 10 MB';
  return undefined;
}

export function SignUpPage() {
  const [search] = useSearchParams();
  // An invitation link carries the invited address, so the offer finds this account later.
  const [values, setValues] = useState<Record<string, string>>(() => ({
    role: 'dealer',
    ...(search.get('email') ? { email: search.get('email')! } : {}),
  }));
  const [document, setDocument] = useState<File | null>(null);
  const [documentTouched, setDocumentTouched] = useState(false);
  const signUp = useMutation({ mutationFn: () => accountsApi.signUp(values, document) });
  const docProblem = documentProblem(document);
  return (
    <RequestFormPage
      title="Apply for an account"
      lead="The registrar verifies every dealer and assessor before they can write to a roll. Until then you can sign in and read."
      request={signUp}
      submitLabel="Apply"
      doneTitle="Check your e-mail"
      onSubmit={() => {
        setDocumentTouched(true);
        if (!docProblem) signUp.mutate();
      }}
    >
      <Field label="I am" required validationMessage={fieldError(signUp.error, 'role')}>
        <RadioGroup
          layout="horizontal"
          value={values.role}
          onChange={(_, d) => setValues((v) => ({ ...v, role: d.value }))}
        >
          <Radio value="dealer" label="a dealer" />
          <Radio value="assessor" label="an assessor" />
        </RadioGroup>
      </Field>
      {FIELDS.map((f) => (
        <Field
          key={f.name}
          label={f.label}
          required={!('optional' in f)}
          hint={f.hint}
          validationMessage={fieldError(signUp.error, f.name)}
        >
          <Input
            name={f.name}
            type={f.type ?? 'text'}
            autoComplete={f.autoComplete}
            value={values[f.name] ?? ''}
            onChange={(_, d) =>
              setValues((v) => ({ ...v, [f.name]: f.name === 'handle' ? d.value.toLowerCase() : d.value }))
            }
          />
        </Field>
      ))}
      <Field
        label="Trade references"
        required
        hint="Dealers, fairs or associations who know your trade, so the registrar can check. Only the registrar sees them."
        validationMessage={fieldError(signUp.error, 'tradeReferences')}
      >
        <Textarea
          name="tradeReferences"
          value={values.tradeReferences ?? ''}
          onChange={(_, d) => setValues((v) => ({ ...v, tradeReferences: d.value }))}
          resize="vertical"
        />
      </Field>
      <Field
        label="A document about your business (optional)"
        hint="For example a trade licence or a fair stand invoice: a PDF, JPEG or PNG file of at most 10 MB. Only the registrar sees it."
        validationMessage={(documentTouched && docProblem) || fieldError(signUp.error, 'document')}
      >
        <input
          type="file"
          name="document"
          accept=".pdf,.jpg,.jpeg,.png,application/pdf,image/jpeg,image/png"
          onChange={(e) => {
            setDocument(e.target.files?.[0] ?? null);
            setDocumentTouched(true);
          }}
        />
      </Field>
    </RequestFormPage>
  );
}
