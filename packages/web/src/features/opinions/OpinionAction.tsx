import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  makeStyles,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import type { LotActionContext } from '../lots/lot-actions';
import { lotsQueries } from '../lots/lots.api';
import { OpinionForm } from './OpinionForm';

const useStyles = makeStyles({ surface: { maxWidth: 'min(1100px, 96vw)', width: '100%' } });

/** The opinion form in a dialog on the lot page; the attribution aid reads the lot's newest clues. */
export function OpinionAction({ code, state, viewer, close }: LotActionContext & { close: () => void }) {
  const styles = useStyles();
  const lot = useQuery(lotsQueries.detail(code));
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface className={styles.surface}>
        <DialogBody>
          <DialogTitle>
            {state.holder === viewer?.id ? 'Your attribution of this lot' : 'Your opinion on this lot'}
          </DialogTitle>
          <DialogContent>
            <OpinionForm
              code={code}
              observations={lot.data?.observations ?? null}
              decoration={state.description?.decoration ?? []}
              onDone={close}
            />
          </DialogContent>
          <DialogActions>
            <Button onClick={close}>Close</Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
