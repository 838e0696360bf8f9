import {
  Checkbox,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { DataTable, type ListColumn } from '../../common/ui/list/DataTable';
import { Page } from '../../common/ui/Page';
import { PrintTagsDialog } from './PrintTagsDialog';
import { tagsQueries, type HeldLotRow } from './tags.api';

const useStyles = makeStyles({
  bar: { display: 'flex', gap: tokens.spacingHorizontalM, alignItems: 'center', flexWrap: 'wrap' },
});

/** The dealer's lots, to choose which get tags (the lots on hand, newest first). */
export function PrintTagsPage() {
  const styles = useStyles();
  const lots = useQuery(tagsQueries.heldLots());
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const items = lots.data?.items ?? [];
  const toggle = (code: string, on: boolean) =>
    setChosen((s) => {
      const next = new Set(s);
      if (on) next.add(code);
      else next.delete(code);
      return next;
    });
  const selection = items.filter((l) => chosen.has(l.code)).map((l) => ({ code: l.code, listed: l.listed }));
  const all = items.length > 0 && chosen.size === items.length;
  const columns: Array<ListColumn<HeldLotRow>> = [
    {
      id: 'chosen',
      header: (
        <Checkbox
          aria-label="Choose all"
          checked={all ? true : chosen.size ? 'mixed' : false}
          onChange={(_, d) => setChosen(d.checked ? new Set(items.map((l) => l.code)) : new Set())}
        />
      ),
      cell: (l) => (
        <Checkbox
          aria-label={`Choose ${l.displayCode}`}
          checked={chosen.has(l.code)}
          onChange={(_, d) => toggle(l.code, Boolean(d.checked))}
        />
      ),
    },
    { id: 'code', header: 'Code', cell: (l) => l.displayCode },
    { id: 'title', header: 'Title', cell: (l) => l.title },
    { id: 'listed', header: 'Public page', cell: (l) => (l.listed ? 'listed' : 'unlisted') },
  ];

  return (
    <Page title="Print tags">
      <Text>
        Choose lots you hold. Each tag names the lot’s newest entry; printing writes nothing on the roll.
      </Text>
      {lots.isPending && <Spinner label="Loading your lots…" />}
      {lots.isError && (
        <MessageBar intent="error">
          <MessageBarBody>{lots.error.message}</MessageBarBody>
        </MessageBar>
      )}
      <div className={styles.bar}>
        <PrintTagsDialog
          lots={selection}
          triggerLabel={
            selection.length
              ? `Print ${selection.length} tag${selection.length === 1 ? '' : 's'}`
              : 'Print tags'
          }
        />
        {lots.data && lots.data.total > items.length && (
          <Text>
            Showing the newest {items.length} of {lots.data.total} lots.
          </Text>
        )}
      </div>
      {lots.data && <DataTable label="Your lots" columns={columns} rows={items} rowKey={(l) => l.code} />}
    </Page>
  );
}
