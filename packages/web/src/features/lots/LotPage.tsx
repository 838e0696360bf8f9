import { recordCautions, verifyRoll, type RollState } from '@beadroll/core';
import {
  Badge,
  Button,
  Card,
  makeStyles,
  MessageBar,
  MessageBarBody,
  MessageBarTitle,
  Spinner,
  Text,
  Title2,
  Title3,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { Fragment, useMemo, useState, type ReactNode } from 'react';
import { Link, useLocation, useParams } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import { OnRecordPanel } from '../opinions/OnRecordPanel';
import { useSession, type Me } from '../accounts/accounts.api';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import {
  BASE_GLASS_LABEL,
  DECORATION_LABEL,
  formatCount,
  formatLength,
  formatMoney,
  formatTime,
  FORM_LABEL,
  ORIGIN_LABEL,
  shortHash,
  STATUS_LABEL,
} from './labels';
import { LOT_ACTIONS, LOT_PANELS, type LotActionContext } from './lot-actions';
import { lotsQueries, useActorNames, type OwnSealedDetails } from './lots.api';
import { SafetyCautions } from '../safety/SafetyCautions';
import { PrivateMark } from './PrivateMark';
import { checkedSealedDetails } from './sealed-details';
import { timelineOf, type TimelineLine } from './timeline';
import { Facts } from '../../common/ui/Facts';

const useStyles = makeStyles({
  page: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalL },
  head: { display: 'grid', gap: tokens.spacingVerticalXS },
  code: { fontFamily: tokens.fontFamilyMonospace, color: tokens.colorNeutralForeground2 },
  badges: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  card: { display: 'grid', gap: tokens.spacingVerticalS, padding: tokens.spacingHorizontalL },
  fold: { display: 'grid', gap: tokens.spacingVerticalXS, color: tokens.colorNeutralForeground2 },
  timeline: { listStyleType: 'none', margin: 0, padding: 0, display: 'grid', gap: tokens.spacingVerticalM },
  item: {
    display: 'grid',
    gap: tokens.spacingVerticalXXS,
    paddingInlineStart: tokens.spacingHorizontalM,
    borderLeft: `${tokens.strokeWidthThick} solid ${tokens.colorBrandStroke1}`,
  },
  meta: { color: tokens.colorNeutralForeground3, overflowWrap: 'anywhere' },
  hash: { fontFamily: tokens.fontFamilyMonospace },
});

function Summary({ state }: { state: RollState }) {
  const styles = useStyles();
  const d = state.description;
  if (!d)
    return (
      <Card className={styles.card}>
        <Text>The newest description of this lot was removed. The holder can write a new one.</Text>
      </Card>
    );
  const rows: Array<[string, React.ReactNode]> = [
    ['Form', FORM_LABEL[d.form]],
    ['Count', `${formatCount(d.count)} beads`],
  ];
  if (state.remaining.value !== d.count.value) rows.push(['Still in this lot', formatCount(state.remaining)]);
  if (d.diameterMm)
    rows.push([
      'Bead size',
      d.diameterMm.min === d.diameterMm.max
        ? formatLength(d.diameterMm.min)
        : `${formatLength(d.diameterMm.min)} to ${formatLength(d.diameterMm.max)}`,
    ]);
  if (d.strandLengthMm !== undefined) rows.push(['Strand length', formatLength(d.strandLengthMm)]);
  if (d.colours.length) rows.push(['Colours', d.colours.join(', ')]);
  if (d.baseGlass.length) rows.push(['Base glass', d.baseGlass.map((g) => BASE_GLASS_LABEL[g]).join(', ')]);
  if (d.decoration.length) rows.push(['Decoration', d.decoration.map((x) => DECORATION_LABEL[x]).join(', ')]);
  if (d.decorationNote) rows.push(['About the decoration', d.decorationNote]);
  if (d.condition) rows.push(['Condition', d.condition]);
  const a = state.attribution?.body;
  rows.push([
    'Holder’s attribution',
    a ? `${ORIGIN_LABEL[a.origin]}, ${a.period.from}–${a.period.to}` : 'None recorded yet',
  ]);
  if (state.dissents.length) rows.push(['Dissenting opinions', String(state.dissents.length)]);
  return (
    <Card className={styles.card} aria-labelledby="lot-summary-title">
      <Title3 as="h2" id="lot-summary-title">
        Summary
      </Title3>
      {d.summary ? <Text>{d.summary}</Text> : null}
      <Facts rows={rows} />
    </Card>
  );
}

function SealedDetails({ sealed }: { sealed: OwnSealedDetails }) {
  const styles = useStyles();
  const rows: Array<[string, React.ReactNode]> = [];
  if (sealed.storageLocation) rows.push(['Kept at', sealed.storageLocation]);
  if (sealed.acquisitionDate) rows.push(['Acquired on', sealed.acquisitionDate]);
  if (sealed.acquisitionSource) rows.push(['Acquired from', sealed.acquisitionSource]);
  if (sealed.acquisitionCost) rows.push(['Cost', formatMoney(sealed.acquisitionCost)]);
  if (sealed.privateNote) rows.push(['Private note', sealed.privateNote]);
  if (!rows.length) return null;
  return (
    <Card className={styles.card} aria-labelledby="lot-private-title">
      <Title3 as="h2" id="lot-private-title">
        Private details
      </Title3>
      <PrivateMark />
      <Facts rows={rows} />
    </Card>
  );
}

function Verification({ result }: { result: ReturnType<typeof verifyRoll> }) {
  if (result.ok && result.unchecked.length > 0) {
    const first = result.unchecked[0]!;
    const rules = result.unchecked.length === 1 ? 'one rule' : `${result.unchecked.length} rules`;
    return (
      <MessageBar intent="warning" layout="multiline" aria-label="Verification">
        <MessageBarBody>
          <MessageBarTitle>Unbroken, but not fully checkable after a removal</MessageBarTitle>
          All {result.entries} entries link up by their hashes, but the registrar removed an older entry's
          contents and {rules} of that older history could not be checked without them (entry {first.seq}:{' '}
          {first.message}).
        </MessageBarBody>
      </MessageBar>
    );
  }
  if (result.ok)
    return (
      <MessageBar intent="success" layout="multiline" aria-label="Verification">
        <MessageBarBody>
          <MessageBarTitle>Verified in this browser</MessageBarTitle>
          All {result.entries} entries link up by their hashes; newest entry {result.head.seq}, hash{' '}
          {shortHash(result.head.hash)}.
        </MessageBarBody>
      </MessageBar>
    );
  return (
    <MessageBar intent="error" layout="multiline" aria-label="Verification">
      <MessageBarBody>
        <MessageBarTitle>This roll does not verify</MessageBarTitle>
        Entry {result.seq} fails: {result.message}. Do not rely on what the server shows for this lot.
      </MessageBarBody>
    </MessageBar>
  );
}

function ActionBar({ ctx }: { ctx: LotActionContext }) {
  const styles = useStyles();
  const [open, setOpen] = useState<string | null>(null);
  const actions = LOT_ACTIONS.filter((a) => a.visible(ctx));
  if (!actions.length) return null;
  const current = actions.find((a) => a.id === open);
  return (
    <div className={styles.actions} role="group" aria-label="Actions">
      {actions.map((a) => (
        <Button key={a.id} onClick={() => setOpen(a.id)}>
          {a.label}
        </Button>
      ))}
      {current ? current.render({ ...ctx, close: () => setOpen(null) }) : null}
    </div>
  );
}

function Timeline({
  entries,
  viewer,
}: {
  entries: ReturnType<typeof verifyRoll>['verified'];
  viewer: Me | null;
}) {
  const styles = useStyles();
  const name = useActorNames(
    entries.map((e) => e.header.actor),
    viewer,
  );
  const lines = timelineOf(entries, (id) => name(id, false));
  const bySeq = new Map(lines.map((l) => [l.seq, l]));
  // An entry a later one corrects is shown folded under that correction, not on its own.
  const folded = new Set(
    lines.flatMap((l) => (l.corrects && bySeq.has(l.corrects.seq) ? [l.corrects.seq] : [])),
  );
  const render = (l: TimelineLine, nested = false): ReactNode => {
    const original = l.corrects ? bySeq.get(l.corrects.seq) : undefined;
    const body = (
      <>
        <Text>
          <Text weight="semibold">{name(l.actor, true)}</Text> {l.what}
        </Text>
        {l.detail ? <Text>{l.detail}</Text> : null}
        {l.corrects ? (
          <Text>
            Corrects entry {l.corrects.seq}: {l.corrects.reason}
          </Text>
        ) : null}
        <Text size={200} className={styles.meta}>
          <time dateTime={l.time}>{formatTime(l.time)}</time> · entry {l.seq} · {l.kind} · hash{' '}
          <span className={styles.hash} title={l.hash}>
            {shortHash(l.hash)}
          </span>
        </Text>
        {original ? (
          <details className={styles.fold}>
            <summary>
              Entry {original.seq}, as first written (corrected on {formatTime(l.time)})
            </summary>
            {render(original, true)}
          </details>
        ) : null}
      </>
    );
    return nested ? (
      <div className={styles.item} data-kind={l.kind}>
        {body}
      </div>
    ) : (
      <li key={l.seq} className={styles.item} data-kind={l.kind}>
        {body}
      </li>
    );
  };
  return (
    <section aria-labelledby="lot-timeline-title">
      <Title3 as="h2" id="lot-timeline-title">
        History
      </Title3>
      <ol className={styles.timeline} reversed>
        {[...lines]
          .reverse()
          .filter((l) => !folded.has(l.seq))
          .map((l) => render(l))}
      </ol>
    </section>
  );
}

/** The dealer's lot page: everything shown comes from core's verifier and reducer over the raw roll. */
export function LotPage() {
  const styles = useStyles();
  const { code = '' } = useParams();
  const registered = (useLocation().state as { registered?: boolean } | null)?.registered === true;
  const { account, isLoading: sessionLoading } = useSession();
  const roll = useQuery({ ...lotsQueries.roll(code), enabled: account !== null });
  const result = useMemo(() => (roll.data ? verifyRoll(roll.data.entries) : null), [roll.data]);
  const sealed = useMemo(
    () => (roll.data && result?.ok ? checkedSealedDetails(roll.data.entries, result.verified) : null),
    [roll.data, result],
  );

  if (sessionLoading) return <Spinner label="Loading…" />;
  if (!account)
    return (
      <Text>
        Please <Link to={`/sign-in?next=/lots/${encodeURIComponent(code)}`}>sign in</Link> to see this lot.
      </Text>
    );
  if (roll.error)
    return (
      <section className={styles.page}>
        <Title2 as="h1">Lot not found</Title2>
        <Text>
          {roll.error instanceof ApiError && roll.error.status === 404
            ? 'There is no lot with this code that you can see.'
            : 'The lot could not be loaded. Please try again.'}
        </Text>
        <Link to="/lots">Back to the inventory</Link>
      </section>
    );
  if (!result) return <Spinner label="Loading the roll and checking it…" />;

  const state = result.ok ? result.state : null;
  const ctx: LotActionContext | null = state ? { code: state.lot, state, viewer: account } : null;

  return (
    <section className={styles.page} aria-labelledby="lot-title">
      <div className={styles.head}>
        <Title2 as="h1" id="lot-title">
          {state?.description?.title ?? 'Lot'}
        </Title2>
        <Text className={styles.code}>Lot {roll.data?.lot}</Text>
        {state ? (
          <div className={styles.badges}>
            <Badge appearance="outline">{STATUS_LABEL[state.status]}</Badge>
            <Badge appearance="outline" color={state.listed ? 'brand' : 'informative'}>
              {state.listed ? 'Listed: has a public page' : 'Unlisted'}
            </Badge>
            {state.holder === account.id ? <Badge appearance="tint">You hold this lot</Badge> : null}
          </div>
        ) : null}
      </div>
      <Verification result={result} />
      {registered && state && state.holder === account.id && state.head.seq <= 1 ? (
        <MessageBar intent="success">
          <MessageBarBody>
            Registered. Print its tag now, while the lot is in your hands.{' '}
            <PrintTagsDialog lots={[{ code: state.lot, listed: state.listed }]} />
          </MessageBarBody>
        </MessageBar>
      ) : null}
      {ctx ? <ActionBar ctx={ctx} /> : null}
      {state ? <Summary state={state} /> : null}
      {ctx ? (
        <OnRecordPanel
          code={ctx.code}
          holder={ctx.state.holder}
          viewer={{ id: account.id, canWrite: account.status === 'verified' }}
        />
      ) : null}
      {result.ok ? (
        <SafetyCautions cautions={recordCautions(result.verified)} label="Handling cautions" />
      ) : null}
      {sealed ? <SealedDetails sealed={sealed.details} /> : null}
      {result.ok ? <Timeline entries={result.verified} viewer={account} /> : null}
      {ctx ? LOT_PANELS.map((p) => <Fragment key={p.id}>{p.render(ctx)}</Fragment>) : null}
    </section>
  );
}
