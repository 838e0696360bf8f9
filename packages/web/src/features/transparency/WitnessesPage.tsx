import {
  Button,
  Field,
  Input,
  makeStyles,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
  Text,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, FormError } from '../../shared/ui/FormPage';
import { RegistrarOnly } from '../registry/RegistrarOnly';
import { witnessesApi, witnessesQuery } from './witnesses.api';

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '60rem' },
  scroller: { overflowX: 'auto' },
  table: { minWidth: '640px' },
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
  return (
    <RegistrarOnly>
      <Witnesses />
    </RegistrarOnly>
  );
}

function Witnesses() {
  const styles = useStyles();
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
      <div className={styles.scroller}>
        <Table className={styles.table} aria-label="Witnesses">
          <TableHeader>
            <TableRow>
              <TableHeaderCell>Witness</TableHeaderCell>
              <TableHeaderCell>Registered</TableHeaderCell>
              <TableHeaderCell>Last cosigned</TableHeaderCell>
              <TableHeaderCell>Checkpoint size</TableHeaderCell>
            </TableRow>
          </TableHeader>
          <TableBody>
            {q.data?.items.map((w) => (
              <TableRow key={w.id}>
                <TableCell>
                  <div>{w.name}</div>
                  <div className={styles.key}>{w.key}</div>
                </TableCell>
                <TableCell>{when(w.registeredAt)}</TableCell>
                <TableCell>{when(w.lastCosignedAt)}</TableCell>
                <TableCell>{w.lastCosignedSize ?? '—'}</TableCell>
              </TableRow>
            ))}
            {q.data && q.data.items.length === 0 && (
              <TableRow>
                <TableCell colSpan={4}>No witness is registered yet.</TableCell>
              </TableRow>
            )}
          </TableBody>
        </Table>
      </div>
      <form
        className={styles.form}
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          register.mutate();
        }}
      >
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
      </form>
    </div>
  );
}
