import {
  attributionOnRecord,
  formatLotCode,
  inheritedRecord,
  periodWords,
  verifyBundle,
  verifyRoll,
  type AttributionOnRecord,
  type WeighedOpinion,
} from '@beadroll/core';
import {
  Body1,
  Button,
  Caption1,
  Card,
  MessageBar,
  MessageBarBody,
  Subtitle2,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useMemo } from 'react';
import { ApiError } from '../../lib/api';
import { lotBundleQuery } from '../lineage/lineage.api';
import { ORIGIN_LABEL } from '../lots/labels';
import { useActorNames } from '../lots/lots.api';
import { opinionsApi } from './opinions.api';

const useStyles = makeStyles({
  card: { display: 'grid', gap: tokens.spacingVerticalS, padding: tokens.spacingHorizontalL },
  dissent: { color: tokens.colorPaletteRedForeground1, fontWeight: tokens.fontWeightSemibold },
});

/** Where an opinion was recorded, in the words of the dealer's lot page. */
function whereText(o: WeighedOpinion): string {
  return o.depth === 0 ? 'on this lot' : `on lot ${formatLotCode(o.lot)}, which these beads came from`;
}

/** The attribution on record of a lot as core derives it from the viewer's verified bundle. */
export function useAttributionOnRecord(code: string): AttributionOnRecord | null {
  const bundle = useQuery(lotBundleQuery(code));
  return useMemo(() => {
    const b = bundle.data;
    if (!b || !verifyBundle(b).ok) return null;
    const own = verifyRoll(b.rolls[0]!.entries, { lot: code });
    if (!own.ok) return null;
    return attributionOnRecord(own.verified, own.state, inheritedRecord(b, code));
  }, [bundle.data, code]);
}

/**
 * The attribution on record on the dealer's lot page: the holder's own, or the one an earlier
 * holder or an ancestor's holder recorded, shown as such, with the opinions that agree and
 * dissent. A holder without an attribution of their own adopts the one on record in one step.
 */
export function OnRecordPanel({
  code,
  viewer,
  holder,
}: {
  code: string;
  viewer: { id: string; canWrite: boolean } | null;
  holder: string;
}) {
  const styles = useStyles();
  const qc = useQueryClient();
  const record = useAttributionOnRecord(code);
  const name = useActorNames(record ? record.opinions.map((o) => o.author) : [], viewer);
  const adopt = useMutation({
    mutationFn: (o: WeighedOpinion) => {
      const { nonce: _nonce, adopts: _adopts, exhibits: _exhibits, ...fields } = o.body;
      return opinionsApi.record(code, {
        ...fields,
        exhibits: o.depth === 0 ? o.body.exhibits : [],
        rationale: `Adopts the attribution recorded ${whereText(o)} (entry ${o.seq}).`,
        adopts: { lot: o.lot, seq: o.seq, hash: o.hash },
      });
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: ['lots'] }),
  });
  if (!record) return null;
  const r = record.record;
  const isHolder = viewer?.id === holder;
  return (
    <Card className={styles.card} role="region" aria-labelledby="on-record-title">
      <Subtitle2 as="h2" id="on-record-title">
        Attribution on record
      </Subtitle2>
      {r ? (
        <>
          <Body1>
            <strong>
              {ORIGIN_LABEL[r.body.origin]}, {periodWords(r.body.period)}
            </strong>
          </Body1>
          <Caption1>
            {record.source === 'holder'
              ? `${r.author === viewer?.id ? 'Your attribution' : `Attributed by the holder, ${name(r.author, false)}`}${record.adopted ? `, adopting the attribution ${whereText(record.adopted)} by ${name(record.adopted.author, false)}` : ''}.`
              : record.source === 'earlier-holder'
                ? `Attributed by the previous holder, ${name(r.author, false)}, on ${new Date(r.time).toLocaleDateString()}.`
                : `Attributed by ${name(r.author, false)} as holder of lot ${formatLotCode(r.lot)}, which these beads came from, on ${new Date(r.time).toLocaleDateString()}.`}
          </Caption1>
          <Body1>
            {record.agree.length} {record.agree.length === 1 ? 'opinion agrees' : 'opinions agree'} ·{' '}
            <span className={record.dissent.length ? styles.dissent : undefined}>
              {record.dissent.length} {record.dissent.length === 1 ? 'dissent' : 'dissents'}
            </span>
          </Body1>
          {isHolder && viewer?.canWrite && record.source !== 'holder' ? (
            <>
              <Body1>
                You hold this lot and have not recorded an attribution. Adopt this one as yours, or record
                your own with “Record an opinion”.
              </Body1>
              <div>
                <Button appearance="primary" disabled={adopt.isPending} onClick={() => adopt.mutate(r)}>
                  Adopt this attribution
                </Button>
              </div>
            </>
          ) : null}
          {adopt.isSuccess ? (
            <MessageBar intent="success">
              <MessageBarBody>The attribution is now yours, citing the one you adopted.</MessageBarBody>
            </MessageBar>
          ) : null}
          {adopt.error ? (
            <MessageBar intent="error">
              <MessageBarBody>
                {adopt.error instanceof ApiError
                  ? adopt.error.message
                  : 'The attribution could not be adopted.'}
              </MessageBarBody>
            </MessageBar>
          ) : null}
        </>
      ) : (
        <Body1>
          No holder of this lot, or of a lot its beads came from, has recorded an attribution yet.
        </Body1>
      )}
    </Card>
  );
}
