import { Button, Field, Input, makeStyles, Text, Title2, tokens } from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, Form, FormError } from '../../common/ui/FormPage';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { witnessesApi, witnessesQuery, type Witness } from './witnesses.api';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '60rem' },
  key: { fontFamily: tokens.fontFamilyMonospace, wordBreak: 'break-all' },
  form: { display: 'grid', gap: tokens.spacingVerticalS, maxWidth: '44rem' },
});

function when(iso: string | null): string {
  if (!iso) return 'never';
  return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' }).format(
    new Date(iso),
  );
}

/** The registrar's list of the public log's witnesses, and when each last cosigned. */
export function WitnessesPage() {
  const styles = useStyles();
  const columns: Array<ListColumn<Witness>> = [
    {
      id: 'name',
      header: 'Witness',
      cell: (w) => (
        <>
          <div>{w.name}</div>
          <div className={styles.key}>{w.key}</div>
        </>
      ),
    },
    { id: 'registered', header: 'Registered', cell: (w) => when(w.registeredAt) },
    { id: 'cosigned', header: 'Last cosigned', cell: (w) => when(w.lastCosignedAt) },
    { id: 'size', header: 'Checkpoint size', cell: (w) => w.lastCosignedSize ?? '—' },
  ];
  const client = useQueryClient();
  const q = useQuery(witnessesQuery());
  const [key, setKey] = useState('');
  const register = useMutation({
    mutationFn: () => witnessesApi.register(key.trim()),
    onSuccess: async () => {
      setKey('');
      await client.invalidateQueries({ queryKey: ['registry', 'witnesses'] });
    },
  });
  return (
    <div className={styles.page}>
      <Title2 as="h1">Witnesses of the public log</Title2>
      <Text>
        Witnesses keep the registry honest: each one checks that every new checkpoint of the public log only
        adds to the last one it saw, and cosigns it. Buyers’ pages count their cosignatures.
      </Text>
      {q.data && (
        <Text>
          The log’s key, to give a new witness: <span className={styles.key}>{q.data.logKey}</span>
        </Text>
      )}
      <DataTable label="Witnesses" columns={columns} rows={q.data?.items ?? []} rowKey={(w) => w.id} />
      {q.data && q.data.items.length === 0 && <Text>No witness is registered yet.</Text>}
      <Form className={styles.form} onSubmit={() => register.mutate()}>
        <Field
          label="Register a witness by its key"
          hint="The witness prints it with npm run witness -- --print-key: name+keyid+key"
          validationMessage={fieldError(register.error, 'key')}
        >
          <Input value={key} onChange={(_, d) => setKey(d.value)} />
        </Field>
        <FormError error={register.error} />
        <div>
          <Button appearance="primary" type="submit" disabled={register.isPending || key.trim() === ''}>
            Register the witness
          </Button>
        </div>
      </Form>
    </div>
  );
}
