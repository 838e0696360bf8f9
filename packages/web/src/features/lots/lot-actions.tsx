import { FINAL_STATUSES, mayAppend, type EntryKind, type Permission, type RollState } from '@beadroll/core';
import type { ReactNode } from 'react';
import type { Me } from '../accounts/accounts.api';
import { OfferDialog } from '../transfers/OfferDialog';
import { RecordSaleDialog } from '../transfers/RecordSaleDialog';
import { WithdrawOfferAction } from '../transfers/WithdrawOfferAction';
import { ExhibitsSection } from '../exhibits/ExhibitsSection';
import { AncestryPanel } from '../lineage/AncestryPanel';
import { CombineDialog } from '../lineage/CombineDialog';
import { SplitDialog } from '../lineage/SplitDialog';
import { OpinionAction } from '../opinions/OpinionAction';
import { OpinionsPanel } from '../opinions/OpinionsPanel';
import { AskOpinionAction } from '../opinion-requests/AskOpinionAction';
import { RemovalRequestAction } from '../registry/RemovalRequestAction';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import {
  DescribeAction,
  ListingAction,
  ObserveAction,
  RegisterLikeAction,
  VoidSaleAction,
} from './LotPageActions';

/**
 * What an action or a panel on the lot page gets: the lot's canonical code, the state core's
 * reducer derived from the verified roll, and the signed-in account (null when nobody is).
 */
export interface LotActionContext {
  code: string;
  state: RollState;
  viewer: Me | null;
}

/**
 * An action on the lot page: a button labelled `label`, shown when `visible` says so; pressing it
 * renders `render` (usually a dialog), which calls `close` when done. After a write, invalidate
 * the query keys under ['lots'] so the page reloads and re-verifies the roll.
 */
export interface LotAction {
  id: string;
  label: string;
  visible: (ctx: LotActionContext) => boolean;
  render: (ctx: LotActionContext & { close: () => void }) => ReactNode;
}

/** A section of the lot page below the timeline (gallery, opinions, ancestry...). */
export interface LotPanel {
  id: string;
  render: (ctx: LotActionContext) => ReactNode;
}

/**
 * The account the page may write as: a verified dealer or assessor. Roles and account status are
 * the server's policy; what that account may append to this roll is core's {@link mayAppend}.
 */
export function writerOf(viewer: Me | null): string | null {
  if (!viewer || viewer.status !== 'verified') return null;
  return viewer.role === 'dealer' || viewer.role === 'assessor' ? viewer.id : null;
}

/** Whether the signed-in account may append `kind` to the lot now, and if not, why. */
export function permission(ctx: LotActionContext, kind: EntryKind, now = new Date()): Permission {
  const writer = writerOf(ctx.viewer);
  if (writer === null)
    return { allowed: false, why: 'actor', reason: 'Sign in as a verified dealer or assessor.' };
  return mayAppend(ctx.state, kind, writer, { now: now.toISOString() });
}

/** True when the signed-in account may append `kind` to the lot now. */
export function may(ctx: LotActionContext, kind: EntryKind): boolean {
  return permission(ctx, kind).allowed;
}

/** The viewer holds the lot (in trade or not): the holder's own tools (describe, removal requests). */
export function viewerHolds(ctx: LotActionContext): boolean {
  return writerOf(ctx.viewer) !== null && ctx.state.holder === ctx.viewer!.id;
}

/** The viewer holds the lot and it is still in trade (held or on offer). */
function holdsInTrade(ctx: LotActionContext): boolean {
  return viewerHolds(ctx) && !FINAL_STATUSES.includes(ctx.state.status);
}

/** Actions in the order they appear. Features add one line each. */
export const LOT_ACTIONS: LotAction[] = [
  {
    id: 'describe',
    label: 'Describe',
    visible: (ctx) => may(ctx, 'described'),
    render: (ctx) => <DescribeAction {...ctx} />,
  },
  {
    id: 'observe',
    label: 'Record observations',
    visible: (ctx) => may(ctx, 'observed'),
    render: (ctx) => <ObserveAction {...ctx} />,
  },
  {
    id: 'listing',
    label: 'List / unlist',
    visible: (ctx) => may(ctx, 'described') && ctx.state.description !== null,
    render: (ctx) => <ListingAction {...ctx} />,
  },
  {
    id: 'print-tag',
    label: 'Print tag',
    visible: holdsInTrade,
    render: (ctx) => (
      <PrintTagsDialog lots={[{ code: ctx.code, listed: ctx.state.listed }]} onClose={ctx.close} />
    ),
  },
  {
    id: 'offer',
    label: 'Offer to a dealer',
    visible: (ctx) => may(ctx, 'transfer-offered'),
    render: (ctx) => <OfferDialog code={ctx.code} title={ctx.state.description?.title} onClose={ctx.close} />,
  },
  {
    id: 'withdraw-offer',
    label: 'Withdraw the offer',
    visible: (ctx) => may(ctx, 'transfer-withdrawn'),
    render: (ctx) => <WithdrawOfferAction code={ctx.code} close={ctx.close} />,
  },
  {
    id: 'sale',
    label: 'Record a sale',
    visible: (ctx) => may(ctx, 'sold'),
    render: (ctx) => (
      <RecordSaleDialog code={ctx.code} title={ctx.state.description?.title} onClose={ctx.close} />
    ),
  },
  {
    id: 'void-sale',
    label: 'Void the sale',
    visible: (ctx) => may(ctx, 'sale-voided'),
    render: (ctx) => <VoidSaleAction {...ctx} />,
  },
  {
    id: 'register-like',
    label: 'Register another like this',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.description !== null,
    render: (ctx) => <RegisterLikeAction {...ctx} />,
  },
  {
    id: 'split',
    label: 'Split',
    visible: (ctx) => may(ctx, 'split') && ctx.state.description !== null,
    render: (ctx) => <SplitDialog lot={{ ...ctx.state, code: ctx.code }} onClose={ctx.close} />,
  },
  {
    id: 'combine',
    label: 'Combine with other lots',
    visible: (ctx) => may(ctx, 'combined') && ctx.state.description !== null,
    render: (ctx) => <CombineDialog lot={{ ...ctx.state, code: ctx.code }} onClose={ctx.close} />,
  },
  {
    id: 'opinion',
    label: 'Record an opinion',
    visible: (ctx) => may(ctx, 'opinion'),
    render: (ctx) => <OpinionAction {...ctx} />,
  },
  {
    id: 'ask-opinion',
    label: 'Ask for an opinion',
    visible: holdsInTrade,
    render: (ctx) => <AskOpinionAction {...ctx} />,
  },
  {
    id: 'removal',
    label: 'Ask for a removal',
    visible: (ctx) => viewerHolds(ctx),
    render: (ctx) => <RemovalRequestAction {...ctx} />,
  },
];

/** Sections of the lot page, in order. Features add one line each. */
export const LOT_PANELS: LotPanel[] = [
  { id: 'exhibits', render: (ctx) => <ExhibitsSection code={ctx.code} canAdd={may(ctx, 'exhibit-added')} /> },
  {
    id: 'opinions',
    render: (ctx) => (
      <OpinionsPanel
        code={ctx.code}
        viewer={ctx.viewer && { id: ctx.viewer.id, canWrite: ctx.viewer.status === 'verified' }}
      />
    ),
  },
  { id: 'ancestry', render: (ctx) => <AncestryPanel code={ctx.code} /> },
];
