import { Body1, Button, Spinner, Title2, makeStyles, tokens } from '@fluentui/react-components';
import { formatLotCode, type BeadCount, type LotDescription, type LotStatus } from '@beadroll/core';
import { useQuery, queryOptions } from '@tanstack/react-query';
import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { api } from '../../lib/api';
import { useSession } from '../accounts/accounts.api';
import { AncestryPanel } from './AncestryPanel';
import { CombineDialog } from './CombineDialog';
import type { LotBasics } from './lineage.api';
import { SplitDialog } from './SplitDialog';
import { beadsText } from './words';

interface LotDetail {
  code: string;
  title: string;
  status: LotStatus;
  listed: boolean;
  description: LotDescription | null;
  remaining: BeadCount;
  viewerIsHolder: boolean;
}

const lotQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'detail', code],
    queryFn: () => api<LotDetail>(`/api/lots/${encodeURIComponent(code)}`),
  });

const useStyles = makeStyles({
  page: { display: 'grid', gap: tokens.spacingVerticalL, maxWidth: '960px' },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, flexWrap: 'wrap' },
});

/** The split and combine actions of a lot, for its holder while the lot is held. */
export function LineageActions({ lot, canWrite }: { lot: LotBasics; canWrite: boolean }) {
  const [open, setOpen] = useState<'split' | 'combine' | null>(null);
  const styles = useStyles();
  if (!canWrite || lot.status !== 'held' || !lot.description) return null;
  return (
    <div className={styles.actions}>
      <Button onClick={() => setOpen('split')}>Split…</Button>
      <Button onClick={() => setOpen('combine')}>Combine with other lots…</Button>
      {open === 'split' && <SplitDialog lot={lot} open onClose={() => setOpen(null)} />}
      {open === 'combine' && <CombineDialog lot={lot} open onClose={() => setOpen(null)} />}
    </div>
  );
}

/** A lot's ancestry page: where its beads came from and went, with split and combine for the holder. */
export function LineagePage() {
  const { code = '' } = useParams();
  const styles = useStyles();
  const { canWrite } = useSession();
  const lot = useQuery(lotQuery(code));
  if (lot.isLoading) return <Spinner label="Loading the lot…" />;
  if (!lot.data) return <Body1>This lot was not found.</Body1>;
  const d = lot.data;
  return (
    <main className={styles.page}>
      <Title2 as="h1">
        {d.title} · {formatLotCode(d.code)}
      </Title2>
      <Body1>
        {d.status === 'held'
          ? `${beadsText(d.remaining)} in this lot.`
          : d.status === 'split' || d.status === 'combined'
            ? 'All its beads went into other lots: it is no longer in the inventory.'
            : `Status: ${d.status}.`}
      </Body1>
      <LineageActions lot={d} canWrite={canWrite && d.viewerIsHolder} />
      <AncestryPanel key={d.code} code={d.code} />
    </main>
  );
}
