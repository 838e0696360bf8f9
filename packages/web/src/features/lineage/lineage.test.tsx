import {
  buildEntry,
  generateLotCode,
  headOf,
  seededRandom,
  type Bundle,
  type BundleEntry,
  type EntryDraft,
  type EntryKind,
  type LotDescription,
  type RollHead,
} from '@beadroll/core';
import { QueryClient } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { Providers } from '../../app/App';
import { AncestryDiagram } from './AncestryDiagram';
import { graphFromBundle, inheritedEvidence } from './graph';
import { SplitDialog } from './SplitDialog';

const random = seededRandom('lineage web tests');
const DEALER = 'acct-odile';

function desc(title: string, value: number, listed = true): LotDescription {
  return {
    title,
    form: 'strand',
    count: { value, estimated: false },
    colours: ['white', 'pink'],
    baseGlass: ['opaque'],
    decoration: ['roses'],
    listed,
  };
}

/** A roll written with core's own entry builder (an invented lot). */
class RollWriter {
  head: RollHead | null = null;
  entries: BundleEntry[] = [];
  constructor(readonly lot: string) {}
  add<K extends EntryKind>(
    kind: K,
    body: EntryDraft<K>['body'],
    time: string,
    parents?: EntryDraft<K>['parents'],
  ) {
    const built = buildEntry(
      this.head,
      { lot: this.head ? undefined : this.lot, kind, actor: DEALER, time, body, parents },
      { random },
    );
    this.entries.push({ ...built.stored, logIndex: null });
    this.head = headOf(built);
    return built;
  }
}

const opinion = (from: number, to: number) => ({
  origin: 'venice-murano' as const,
  period: { from, to, approximate: true },
  technique: 'wound-lampwork' as const,
  qualifier: 'attributed-to' as const,
  confidence: 'medium' as const,
  rationale: 'Irregular holes with grey powder; raised roses.',
  exhibits: [],
});

/** A listed strand with an opinion, split into two; then a later opinion on the parent. */
function splitScenario(parentListed = true) {
  const parent = new RollWriter(generateLotCode(random));
  const a = new RollWriter(generateLotCode(random));
  const b = new RollWriter(generateLotCode(random));
  parent.add(
    'registered',
    { description: desc('Rose strand', 60, parentListed) },
    '2026-01-02T10:00:00.000Z',
  );
  parent.add('opinion', opinion(1860, 1900), '2026-01-03T10:00:00.000Z');
  const split = parent.add(
    'split',
    {
      children: [
        { lot: a.lot, count: { value: 20, estimated: false } },
        { lot: b.lot, count: { value: 40, estimated: false } },
      ],
    },
    '2026-01-04T10:00:00.000Z',
  );
  const link = [{ lot: parent.lot, seq: split.header.seq, hash: split.stored.hash }];
  a.add('registered', { description: desc('Short rose strand', 20) }, '2026-01-04T10:00:00.000Z', link);
  b.add('registered', { description: desc('Long rose strand', 40) }, '2026-01-04T10:00:00.000Z', link);
  parent.add('opinion', opinion(1920, 1940), '2026-01-05T10:00:00.000Z');
  return { parent, a, b };
}

function bundleOf(rolls: Array<{ w: RollWriter; scope?: 'full' | 'link' }>): Bundle {
  return {
    format: 'beadroll-bundle',
    version: 1,
    rolls: rolls.map(({ w, scope = 'full' }) => ({
      lot: w.lot,
      scope,
      entries: scope === 'full' ? w.entries : w.entries.filter((e) => JSON.parse(e.header).kind === 'split'),
    })),
    checkpoints: [],
  };
}

const href = (code: string) => `/l/${code}`;

describe('ancestry from a verified bundle', () => {
  it('draws a child with its listed parent, the split count on the arrow', () => {
    const { parent, a } = splitScenario();
    const g = graphFromBundle(bundleOf([{ w: a }, { w: parent }]), a.lot, href)!;
    expect(g.nodes).toEqual([
      { code: a.lot, depth: 0, title: 'Short rose strand', href: `/l/${a.lot}` },
      { code: parent.lot, depth: -1, title: 'Rose strand', href: `/l/${parent.lot}` },
    ]);
    expect(g.edges).toEqual([
      { from: parent.lot, to: a.lot, kind: 'split', count: { value: 20, estimated: false } },
    ]);
  });

  it('names an unlisted parent by its code only, with no page', () => {
    const { parent, a } = splitScenario(false);
    const g = graphFromBundle(bundleOf([{ w: a }, { w: parent, scope: 'link' }]), a.lot, href)!;
    expect(g.nodes[1]).toEqual({ code: parent.lot, depth: -1, title: null, href: undefined });
    expect(inheritedEvidence(bundleOf([{ w: a }, { w: parent, scope: 'link' }]), a.lot)).toEqual([]);
  });

  it('shows the parent’s children from the parent’s own page', () => {
    const { parent, a, b } = splitScenario();
    const g = graphFromBundle(bundleOf([{ w: parent }]), parent.lot, href)!;
    expect(g.nodes.map((n) => [n.code, n.depth])).toEqual([
      [parent.lot, 0],
      [a.lot, 1],
      [b.lot, 1],
    ]);
  });

  it('inherits the opinions recorded before the split and after it, each marked', () => {
    const { parent, a } = splitScenario();
    const items = inheritedEvidence(bundleOf([{ w: a }, { w: parent }]), a.lot);
    expect(items.map((i) => [i.seq, i.kind, i.before])).toEqual([
      [1, 'opinion', true],
      [3, 'opinion', false],
    ]);
    expect(items[0]).toMatchObject({ lot: parent.lot, seq: 1, kind: 'opinion' });
    expect(items[0]!.opinion!.period).toEqual({ from: 1860, to: 1900, approximate: true });
  });

  it('draws nothing from a bundle whose parent was tampered with', () => {
    const { parent, a } = splitScenario();
    const bundle = bundleOf([{ w: a }, { w: parent }]);
    const split = bundle.rolls[1]!.entries[2]!;
    bundle.rolls[1]!.entries[2] = { ...split, body: split.body!.replace('"value":20', '"value":21') };
    expect(graphFromBundle(bundle, a.lot, href)).toBeNull();
    expect(inheritedEvidence(bundle, a.lot)).toEqual([]);
  });
});

describe('the ancestry diagram', () => {
  it('links every other lot to its page and marks the lot itself', () => {
    const { parent, a } = splitScenario();
    const g = graphFromBundle(bundleOf([{ w: a }, { w: parent }]), a.lot, href)!;
    render(<AncestryDiagram graph={g} />);
    const link = screen.getByRole('link', { name: /Rose strand/ });
    expect(link).toHaveAttribute('href', `/l/${parent.lot}`);
    expect(screen.getByRole('img', { name: /^This lot/ })).toBeInTheDocument();
    expect(screen.getAllByRole('link')).toHaveLength(1);
  });
});

describe('the split dialog', () => {
  it('shows the remainder, refuses counts over the lot and sends the children', async () => {
    const calls: Array<{ url: string; body: string }> = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        calls.push({ url, body: init?.body as string });
        return new Response(
          JSON.stringify({
            parent: 'KVFZJJKET',
            seq: 3,
            remaining: { value: 10, estimated: false },
            status: 'held',
            children: [
              { code: 'JE5BCHQ1X', displayCode: 'JE5B-CHQ1-X', count: { value: 30, estimated: false } },
              { code: '6QZKXMJK9', displayCode: '6QZK-XMJK-9', count: { value: 20, estimated: false } },
            ],
          }),
          { status: 201, headers: { 'Content-Type': 'application/json' } },
        );
      }),
    );
    const user = userEvent.setup();
    render(
      <Providers client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}>
        <SplitDialog
          onClose={() => {}}
          lot={{
            code: 'KVFZJJKET',
            description: desc('Rose strand', 60),
            remaining: { value: 60, estimated: false },
            status: 'held',
          }}
        />
      </Providers>,
    );
    const counts = screen.getAllByRole('spinbutton', { name: /Beads/ });
    fireEvent.change(counts[0]!, { target: { value: '40' } });
    fireEvent.change(counts[1]!, { target: { value: '30' } });
    expect(screen.getByText('The new lots hold 70 beads; the lot has 60.')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Split' })).toBeDisabled();
    fireEvent.change(counts[0]!, { target: { value: '30' } });
    fireEvent.change(counts[1]!, { target: { value: '20' } });
    expect(screen.getByRole('status')).toHaveTextContent('10 beads stay with this lot.');
    await user.click(screen.getByRole('button', { name: 'Split' }));
    await waitFor(() => expect(screen.getByText(/Split into JE5B-CHQ1-X, 6QZK-XMJK-9/)).toBeInTheDocument());
    expect(calls[0]!.url).toBe('/api/lots/KVFZJJKET/splits');
    const sent = JSON.parse(calls[0]!.body) as { children: Array<{ description: LotDescription }> };
    expect(sent.children.map((c) => c.description.count)).toEqual([
      { value: 30, estimated: false },
      { value: 20, estimated: false },
    ]);
    expect(sent.children[0]!.description).toMatchObject({
      colours: ['white', 'pink'],
      decoration: ['roses'],
    });
  });
});
