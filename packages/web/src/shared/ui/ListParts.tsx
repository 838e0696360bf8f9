import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { useSearchParams } from 'react-router-dom';

export const useListStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL },
  head: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  grow: { flexGrow: 1 },
  scroller: { overflowX: 'auto' },
  tabs: { overflowX: 'auto', maxWidth: '100%' },
  table: { minWidth: '720px' },
  pager: { display: 'flex', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  sub: { color: tokens.colorNeutralForeground3 },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
});

/** List state kept in the URL: filters and the page (reset to 1 when a filter changes). */
export function useListParams() {
  const [search, setSearch] = useSearchParams();
  const page = Math.max(1, Number(search.get('page')) || 1);
  const update = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (!('page' in changes)) next.delete('page');
    setSearch(next, { replace: true });
  };
  return { search, page, update };
}

export function Pager({
  page,
  total,
  pageSize,
  noun,
  onPage,
}: {
  page: number;
  total: number;
  pageSize: number;
  noun: string;
  onPage: (p: number) => void;
}) {
  const styles = useListStyles();
  const pages = Math.max(1, Math.ceil(total / pageSize));
  return (
    <div className={styles.pager}>
      <Button disabled={page <= 1} onClick={() => onPage(page - 1)}>
        Previous
      </Button>
      <Text>
        Page {page} of {pages} · {total} {noun}
      </Text>
      <Button disabled={page >= pages} onClick={() => onPage(page + 1)}>
        Next
      </Button>
    </div>
  );
}
