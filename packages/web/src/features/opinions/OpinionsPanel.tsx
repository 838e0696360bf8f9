import { LIMITS } from '@beadroll/core';
import {
  Badge,
  Button,
  Card,
  Field,
  makeStyles,
  mergeClasses,
  Subtitle1,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { fieldError, Form, FormError } from '../../common/ui/FormPage';
import { brandVars } from '../public-lot/brand-vars';
import { ConsensusChart } from '../public-lot/ConsensusChart';
import '../public-lot/public-lot.css';
import { opinionsApi, opinionsQuery, type LotOpinions, type OpinionView } from './opinions.api';
import { CONFIDENCE_LABELS, originLabel, periodLabel, QUALIFIER_LABELS, TECHNIQUE_LABELS } from './words';

const useStyles = makeStyles({
  root: { display: 'grid', gap: tokens.spacingVerticalL },
  beside: {
    display: 'grid',
    gap: tokens.spacingHorizontalL,
    gridTemplateColumns: 'repeat(auto-fit, minmax(280px, 1fr))',
    alignItems: 'start',
  },
  column: { display: 'grid', gap: tokens.spacingVerticalM },
  card: { display: 'grid', gap: tokens.spacingVerticalXS },
  attribution: {
    borderLeftWidth: tokens.strokeWidthThickest,
    borderLeftStyle: 'solid',
    borderLeftColor: tokens.colorBrandStroke1,
  },
  dissent: {
    borderLeftWidth: tokens.strokeWidthThickest,
    borderLeftStyle: 'solid',
    borderLeftColor: tokens.colorPaletteDarkOrangeBorder2,
  },
  meta: { color: tokens.colorNeutralForeground3 },
  reply: {
    paddingInlineStart: tokens.spacingHorizontalM,
    borderLeftWidth: tokens.strokeWidthThin,
    borderLeftStyle: 'solid',
    borderLeftColor: tokens.colorNeutralStroke2,
  },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  hint: { color: tokens.colorNeutralForeground3 },
  chart: { maxWidth: '640px' },
});

// The public page's chart reads its colours from custom properties; here they come from the theme.
const CHART_VARS = {
  ...brandVars,
  '--ink': tokens.colorNeutralForeground1,
  '--ink-muted': tokens.colorNeutralForeground3,
  '--line': tokens.colorNeutralStroke2,
  '--dissent': tokens.colorPaletteDarkOrangeForeground1,
} as React.CSSProperties;

export interface Viewer {
  id: string;
  canWrite: boolean;
}

function nameIn(data: LotOpinions) {
  return (id: string) => {
    const c = data.cards[id];
    return c
      ? c.business && c.business !== c.displayName
        ? `${c.displayName}, ${c.business}`
        : c.displayName
      : 'a former account';
  };
}

function OpinionCard({
  code,
  opinion,
  data,
  viewer,
}: {
  code: string;
  opinion: OpinionView;
  data: LotOpinions;
  viewer: Viewer | null;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const name = nameIn(data);
  const [replying, setReplying] = useState(false);
  const [text, setText] = useState('');
  const done = (r: { opinions: LotOpinions }) => {
    client.setQueryData(opinionsQuery(code).queryKey, r.opinions);
    void client.invalidateQueries({ queryKey: ['lots'] });
  };
  const withdraw = useMutation({
    mutationFn: () => opinionsApi.withdraw(code, opinion.seq),
    onSuccess: done,
  });
  const reply = useMutation({
    mutationFn: () => opinionsApi.reply(code, opinion.seq, text),
    onSuccess: (r) => {
      setReplying(false);
      setText('');
      done(r);
    },
  });
  const b = opinion.body;
  const roleWords =
    opinion.role === 'attribution'
      ? 'Holder’s attribution'
      : opinion.role === 'dissent'
        ? 'Dissent'
        : 'Opinion';
  const mine = viewer?.canWrite && viewer.id === opinion.author;
  const holderMayAnswer = viewer?.canWrite && viewer.id === data.holder && opinion.author !== data.holder;
  return (
    <Card
      className={mergeClasses(
        styles.card,
        opinion.role === 'attribution' && styles.attribution,
        opinion.role === 'dissent' && styles.dissent,
      )}
      role="article"
      aria-label={`${roleWords} by ${name(opinion.author)}`}
    >
      <div className={styles.actions}>
        <Badge
          appearance={opinion.role === 'other' ? 'outline' : 'filled'}
          color={
            opinion.role === 'dissent' ? 'danger' : opinion.role === 'attribution' ? 'brand' : 'informative'
          }
        >
          {roleWords}
        </Badge>
      </div>
      {b ? (
        <>
          <Text weight="semibold" size={400}>
            {originLabel(b.origin, b.originNote)}, {periodLabel(b.period)}
          </Text>
          <Text>
            {QUALIFIER_LABELS[b.qualifier]} · {TECHNIQUE_LABELS[b.technique]} ·{' '}
            {CONFIDENCE_LABELS[b.confidence]}
            {b.exhibits.length > 0
              ? ` · cites ${b.exhibits.length} ${b.exhibits.length === 1 ? 'exhibit' : 'exhibits'}`
              : ''}
          </Text>
          {b.decoration && <Text>Decoration: {b.decoration}</Text>}
          {b.rationale && <Text block>{b.rationale}</Text>}
        </>
      ) : (
        <Text>The contents of this opinion were removed by the registrar.</Text>
      )}
      <Text size={200} className={styles.meta}>
        By {name(opinion.author)}, {new Date(opinion.time).toLocaleDateString()} · entry {opinion.seq}
      </Text>
      {opinion.replies.map((r) => (
        <div key={r.seq} className={styles.reply} aria-label={`Answer by ${name(r.author)}`}>
          <Text block>{r.text}</Text>
          <Text size={200} className={styles.meta}>
            Answer by {name(r.author)}
            {r.author === data.holder ? ' (holder)' : ''}, {new Date(r.time).toLocaleDateString()}
          </Text>
        </div>
      ))}
      {replying && (
        <Form onSubmit={() => reply.mutate()}>
          <Field label="Your answer" validationMessage={fieldError(reply.error, 'text')}>
            <Textarea value={text} maxLength={LIMITS.longText} onChange={(_, d) => setText(d.value)} />
          </Field>
          <FormError error={reply.error && !fieldError(reply.error, 'text') ? reply.error : null} />
          <div className={styles.actions}>
            <Button appearance="primary" type="submit" disabled={reply.isPending}>
              Add answer
            </Button>
            <Button onClick={() => setReplying(false)}>Cancel</Button>
          </div>
        </Form>
      )}
      {(mine || holderMayAnswer) && !replying && (
        <div className={styles.actions}>
          {holderMayAnswer && <Button onClick={() => setReplying(true)}>Answer</Button>}
          {mine && (
            <Button onClick={() => withdraw.mutate()} disabled={withdraw.isPending}>
              Withdraw my opinion
            </Button>
          )}
        </div>
      )}
      <FormError error={withdraw.error} />
    </Card>
  );
}

/**
 * The opinions panel of a lot: the holder's attribution with the dissents plainly beside it,
 * other opinions below, and the consensus chart. Authors may withdraw their own opinions; the
 * holder may answer any other's.
 */
export function OpinionsPanel({ code, viewer }: { code: string; viewer: Viewer | null }) {
  const styles = useStyles();
  const q = useQuery(opinionsQuery(code));
  if (q.isLoading) return <Text>Loading opinions…</Text>;
  if (q.error || !q.data) return <FormError error={q.error ?? new Error('no data')} />;
  const data = q.data;
  const attribution = data.opinions.find((o) => o.role === 'attribution');
  const dissents = data.opinions.filter((o) => o.role === 'dissent');
  const others = data.opinions.filter((o) => o.role === 'other');
  const card = (o: OpinionView) => (
    <OpinionCard key={o.seq} code={code} opinion={o} data={data} viewer={viewer} />
  );
  return (
    <section className={styles.root} aria-labelledby="opinions-title">
      <Subtitle1 as="h2" id="opinions-title">
        Attribution and opinions
      </Subtitle1>
      {dissents.length > 0 && (
        <Text weight="semibold">
          {dissents.length} {dissents.length === 1 ? 'dissent' : 'dissents'} from the holder’s attribution.
        </Text>
      )}
      <div className={styles.beside}>
        <div className={styles.column}>
          {attribution ? card(attribution) : <Text>No attribution by the holder yet.</Text>}
        </div>
        {dissents.length > 0 && <div className={styles.column}>{dissents.map(card)}</div>}
      </div>
      <div className={styles.chart} style={CHART_VARS}>
        <ConsensusChart
          opinions={data.opinions.flatMap((o) => (o.body ? [{ ...o, body: o.body }] : []))}
          nameOf={nameIn(data)}
        />
      </div>
      {others.length > 0 && <div className={styles.column}>{others.map(card)}</div>}
      <Text size={200} className={styles.hint}>
        Opinions are recorded as their authors gave them; none is an authentication. Ask a specialist before
        relying on one, and follow your local consumer-protection rules on describing goods as antique or
        vintage.
      </Text>
    </section>
  );
}
