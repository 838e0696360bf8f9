import type { RollState } from '@beadroll/core';
import type { ReactNode } from 'react';
import type { Me } from '../accounts/accounts.api';
import { OfferDialog } from '../transfers/OfferDialog';
import { RecordSaleDialog } from '../transfers/RecordSaleDialog';
import { WithdrawOfferAction } from '../transfers/WithdrawOfferAction';
import { ExhibitsSection } from '../exhibits/ExhibitsSection';
import { mayAddExhibits } from '../exhibits/exhibits-panel';
import { AncestryPanel } from '../lineage/AncestryPanel';
import { CombineDialog } from '../lineage/CombineDialog';
import { SplitDialog } from '../lineage/SplitDialog';
import { mayRecordOpinion, OpinionAction } from '../opinions/OpinionAction';
import { OpinionsPanel } from '../opinions/OpinionsPanel';
import { AskOpinionAction } from '../opinion-requests/AskOpinionAction';
import { RemovalRequestAction } from '../registry/RemovalRequestAction';
import { PrintTagsDialog } from '../tags/PrintTagsDialog';
import {
  DescribeAction,
  ListingAction,
  mayVoidSale,
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

const ACTIVE: ReadonlyArray<RollState['status']> = ['held', 'offered'];

/** The holder of a lot that is still held (not sold, split away, combined or retired). */
export function viewerHolds(ctx: LotActionContext): boolean {
  return (
    ctx.viewer !== null &&
    ctx.viewer.role === 'dealer' &&
    ctx.viewer.status === 'verified' &&
    ctx.state.holder === ctx.viewer.id
  );
}

/** Actions in the order they appear. Features add one line each. */
export const LOT_ACTIONS: LotAction[] = [
  {
    id: 'describe',
    label: 'Describe',
    visible: (ctx) => viewerHolds(ctx),
    render: (ctx) => <DescribeAction {...ctx} />,
  },
  {
    id: 'observe',
    label: 'Record observations',
    visible: (ctx) => viewerHolds(ctx) && ACTIVE.includes(ctx.state.status),
    render: (ctx) => <ObserveAction {...ctx} />,
  },
  {
    id: 'listing',
    label: 'List / unlist',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.description !== null,
    render: (ctx) => <ListingAction {...ctx} />,
  },
  {
    id: 'print-tag',
    label: 'Print tag',
    visible: (ctx) => viewerHolds(ctx) && ACTIVE.includes(ctx.state.status),
    render: (ctx) => (
      <PrintTagsDialog lots={[{ code: ctx.code, listed: ctx.state.listed }]} onClose={ctx.close} />
    ),
  },
  {
    id: 'offer',
    label: 'Offer to a dealer',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.status === 'held',
    render: (ctx) => <OfferDialog code={ctx.code} title={ctx.state.description?.title} onClose={ctx.close} />,
  },
  {
    id: 'withdraw-offer',
    label: 'Withdraw the offer',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.status === 'offered',
    render: (ctx) => <WithdrawOfferAction code={ctx.code} close={ctx.close} />,
  },
  {
    id: 'sale',
    label: 'Record a sale',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.status === 'held',
    render: (ctx) => (
      <RecordSaleDialog code={ctx.code} title={ctx.state.description?.title} onClose={ctx.close} />
    ),
  },
  {
    id: 'void-sale',
    label: 'Void the sale',
    visible: (ctx) =>
      ctx.viewer !== null && ctx.viewer.status === 'verified' && mayVoidSale(ctx.state, ctx.viewer.id),
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
    visible: (ctx) => viewerHolds(ctx) && ctx.state.status === 'held' && ctx.state.description !== null,
    render: (ctx) => <SplitDialog lot={{ ...ctx.state, code: ctx.code }} onClose={ctx.close} />,
  },
  {
    id: 'combine',
    label: 'Combine with other lots',
    visible: (ctx) => viewerHolds(ctx) && ctx.state.status === 'held' && ctx.state.description !== null,
    render: (ctx) => <CombineDialog lot={{ ...ctx.state, code: ctx.code }} onClose={ctx.close} />,
  },
  {
    id: 'opinion',
    label: 'Record an opinion',
    visible: mayRecordOpinion,
    render: (ctx) => <OpinionAction {...ctx} />,
  },
  {
    id: 'ask-opinion',
    label: 'Ask for an opinion',
    visible: (ctx) => viewerHolds(ctx) && ACTIVE.includes(ctx.state.status),
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
  { id: 'exhibits', render: (ctx) => <ExhibitsSection code={ctx.code} canAdd={mayAddExhibits(ctx)} /> },
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
