import {
  Button,
  Field,
  Link as FluentLink,
  makeStyles,
  MessageBar,
  MessageBarBody,
  ProgressBar,
  Select,
  Spinner,
  Table,
  TableBody,
  TableCell,
  TableHeader,
  TableHeaderCell,
  TableRow,
  Text,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, Navigate } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { FormError } from '../../common/ui/FormPage';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { lotImportsApi, type CheckResult, type Mapping, type SheetInfo } from './lot-imports.api';
import { Page } from '../../common/ui/Page';

const PROBLEM_COLUMNS: Array<ListColumn<{ row: number; key: string; column: string; message: string }>> = [
  { id: 'row', header: 'Row', cell: (p) => p.row },
  { id: 'column', header: 'Column', cell: (p) => p.column },
  { id: 'message', header: 'What to enter', cell: (p) => p.message },
];

const useStyles = makeStyles({
  step: {
    display: 'grid',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    minWidth: 0,
  },
  links: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalL },
  scroll: { overflowX: 'auto' },
  buttons: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  muted: { color: tokens.colorNeutralForeground3 },
});

/**
 * Importing lots from a spreadsheet: the template, the column mapping with a preview, a dry
 * run listing every row's problems, then the import of every row at once with its progress.
 */
export function ImportLotsPage() {
  const styles = useStyles();
  const client = useQueryClient();
  const { account, isLoading, canWrite } = useSession();
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<Mapping>({});
  const [checked, setChecked] = useState<CheckResult | null>(null);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const sheet = useMutation({
    mutationFn: lotImportsApi.sheet,
    onSuccess: (s) => {
      setMapping(Object.fromEntries(s.fields.map((f) => [f.key, s.suggested[f.key] ?? null])));
      setChecked(null);
    },
  });
  const check = useMutation({
    mutationFn: () => lotImportsApi.check(file!, mapping),
    onSuccess: setChecked,
  });
  const run = useMutation({
    mutationFn: () => lotImportsApi.run(file!, mapping, (done, total) => setProgress({ done, total })),
    onSuccess: () => client.invalidateQueries({ queryKey: ['lots'] }),
  });

  if (isLoading) return <Spinner label="Loading…" />;
  if (!account) return <Navigate to="/sign-in?next=/lots/import" replace />;
  if (account.role !== 'dealer') return <Text>Only dealers import lots.</Text>;
  if (!canWrite) return <Text>You can import lots once the registrar has verified your account.</Text>;

  const info: SheetInfo | undefined = sheet.data;
  const remap = (key: string, v: string) => {
    setMapping((m) => ({ ...m, [key]: v === '' ? null : Number(v) }));
    setChecked(null);
  };
  const preview = (key: string) => {
    const i = mapping[key];
    if (i === null || i === undefined || !info) return '';
    return info.preview
      .slice(0, 3)
      .map((r) => r[i] ?? '')
      .filter(Boolean)
      .join(' · ');
  };
  const ready = checked !== null && checked.rows.length === 0 && checked.total > 0;

  return (
    <Page title="Import lots from a spreadsheet" width="medium">
      <Text>
        For a large purchase: one row per lot, up to 500 lots at once. Nothing is written until every row is
        right, and then all of them are registered together.
      </Text>

      <section className={styles.step} aria-labelledby="import-step-1">
        <Title3 as="h2" id="import-step-1">
          1. The spreadsheet
        </Title3>
        <div className={styles.links}>
          <FluentLink href={lotImportsApi.templateUrl('xlsx')} download>
            Download the template (XLSX)
          </FluentLink>
          <FluentLink href={lotImportsApi.templateUrl('csv')} download>
            Download the template (CSV)
          </FluentLink>
        </div>
        <Field label="Your filled-in spreadsheet (CSV or XLSX)" validationMessage={sheet.error?.message}>
          {(props) => (
            <input
              {...props}
              type="file"
              accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
              disabled={run.isPending}
              onChange={(e) => {
                const f = e.currentTarget.files?.[0] ?? null;
                setFile(f);
                setChecked(null);
                setProgress(null);
                run.reset();
                if (f) sheet.mutate(f);
              }}
            />
          )}
        </Field>
        {sheet.isPending ? <Spinner size="small" label="Reading the spreadsheet…" /> : null}
      </section>

      {info ? (
        <section className={styles.step} aria-labelledby="import-step-2">
          <Title3 as="h2" id="import-step-2">
            2. Which column holds what
          </Title3>
          <Text>
            {info.total} {info.total === 1 ? 'row' : 'rows'} below the header. Columns named as in the
            template are matched already; the first rows show beside each choice.
          </Text>
          <div className={styles.scroll}>
            <Table aria-label="Column mapping" size="small">
              <TableHeader>
                <TableRow>
                  <TableHeaderCell>Lot field</TableHeaderCell>
                  <TableHeaderCell>Column in your file</TableHeaderCell>
                  <TableHeaderCell>First rows</TableHeaderCell>
                </TableRow>
              </TableHeader>
              <TableBody>
                {info.fields.map((f) => (
                  <TableRow key={f.key}>
                    <TableCell>
                      {f.header}
                      {f.required ? ' (required)' : ''}
                      <Text size={200} className={styles.muted} block>
                        {f.hint}
                      </Text>
                    </TableCell>
                    <TableCell>
                      <Select
                        aria-label={`Column for ${f.header}`}
                        value={
                          mapping[f.key] === null || mapping[f.key] === undefined
                            ? ''
                            : String(mapping[f.key])
                        }
                        onChange={(_, d) => remap(f.key, d.value)}
                        disabled={run.isPending}
                      >
                        <option value="">Not in the file</option>
                        {info.headers.map((h, i) => (
                          <option key={i} value={String(i)}>
                            {h || `Column ${i + 1}`}
                          </option>
                        ))}
                      </Select>
                    </TableCell>
                    <TableCell>{preview(f.key)}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </div>
          <div className={styles.buttons}>
            <Button
              appearance="primary"
              disabled={check.isPending || run.isPending}
              onClick={() => check.mutate()}
            >
              {check.isPending ? 'Checking…' : 'Check every row'}
            </Button>
            <Text className={styles.muted}>A check writes nothing.</Text>
          </div>
          <FormError error={check.error} />
        </section>
      ) : null}

      {checked ? (
        <section className={styles.step} aria-labelledby="import-step-3">
          <Title3 as="h2" id="import-step-3">
            3. Check and import
          </Title3>
          {checked.rows.length ? (
            <>
              <MessageBar intent="error">
                <MessageBarBody>
                  {checked.rows.length} of {checked.total} rows need attention. Fix them in your file, choose
                  it again and check again; nothing has been imported.
                </MessageBarBody>
              </MessageBar>
              <DataTable
                label="Rows that need attention"
                size="small"
                columns={PROBLEM_COLUMNS}
                rows={checked.rows.flatMap((r) =>
                  r.problems.map((p, j) => ({ row: r.row, key: `${r.row}-${j}`, ...p })),
                )}
                rowKey={(p) => p.key}
              />
            </>
          ) : (
            <MessageBar intent="success">
              <MessageBarBody>All {checked.total} rows are ready to import.</MessageBarBody>
            </MessageBar>
          )}
          {ready && !run.isSuccess ? (
            <Button appearance="primary" disabled={run.isPending} onClick={() => run.mutate()}>
              {run.isPending
                ? 'Importing…'
                : `Import ${checked.total} ${checked.total === 1 ? 'lot' : 'lots'}`}
            </Button>
          ) : null}
          {progress ? (
            <Field
              label="Import progress"
              validationState={run.isError ? 'error' : run.isSuccess ? 'success' : 'none'}
              validationMessage={
                run.isSuccess
                  ? `${run.data.length} lots registered.`
                  : run.isPending
                    ? `${progress.done} of ${progress.total} written; they are kept only when all are written.`
                    : undefined
              }
            >
              <ProgressBar
                value={progress.total ? progress.done / progress.total : 0}
                max={1}
                thickness="large"
              />
            </Field>
          ) : null}
          <FormError error={run.error} />
          {run.isSuccess ? <Link to="/lots">See them in the inventory</Link> : null}
        </section>
      ) : null}
    </Page>
  );
}
