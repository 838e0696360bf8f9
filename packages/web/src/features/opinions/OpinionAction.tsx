import { useQuery } from '@tanstack/react-query';
import { PanelDialog } from '../../common/ui/ActionDialog';
import type { LotActionContext } from '../lots/lot-actions';
import { lotsQueries } from '../lots/lots.api';
import { OpinionForm } from './OpinionForm';

/** The opinion form in a dialog on the lot page; the attribution aid reads the lot's newest clues. */
export function OpinionAction({ code, state, viewer, close }: LotActionContext & { close: () => void }) {
  const lot = useQuery(lotsQueries.detail(code));
  return (
    <PanelDialog
      title={state.holder === viewer?.id ? 'Your attribution of this lot' : 'Your opinion on this lot'}
      close={close}
      wide
    >
      <OpinionForm
        code={code}
        observations={lot.data?.observations ?? null}
        decoration={state.description?.decoration ?? []}
        onDone={close}
      />
    </PanelDialog>
  );
}
