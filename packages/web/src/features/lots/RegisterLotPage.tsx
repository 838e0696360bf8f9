import {
  Button,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  Title2,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { Link, Navigate, useNavigate } from 'react-router-dom';
import { ApiError } from '../../lib/api';
import { focusFirstError } from '../../lib/focus-first-error';
import { useSession } from '../accounts/accounts.api';
import { FormError } from '../accounts/FormPage';
import {
  clearDraft,
  draftToRequest,
  EMPTY_DRAFT,
  loadDraft,
  saveDraft,
  type FieldErrors,
  type LotDraft,
} from './lot-draft';
import {
  DescriptionSections,
  ListingSection,
  PrivateSections,
  Section,
  type Change,
} from './LotFormSections';
import { lotsApi } from './lots.api';
import { ObservationChecklist } from './ObservationChecklist';

const useStyles = makeStyles({
  // One column that may shrink below its content's widest line, so nothing pushes past a phone screen.
  page: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalL,
    maxWidth: '880px',
  },
  form: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: tokens.spacingVerticalL },
  buttons: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
});

/** The register form: a draft kept across reloads, checked here and again by the server. */
export function RegisterLotPage() {
  const styles = useStyles();
  const { account, isLoading, canWrite } = useSession();
  const navigate = useNavigate();
  const client = useQueryClient();
  const [draft, setDraft] = useState<LotDraft>(() => loadDraft());
  const [local, setLocal] = useState<FieldErrors>({});
  useEffect(() => saveDraft(draft), [draft]);
  const formRef = useRef<HTMLFormElement>(null);
  const register = useMutation({
    mutationFn: lotsApi.register,
    onError: () => focusFirstError(formRef.current),
    onSuccess: async (lot) => {
      clearDraft();
      await client.invalidateQueries({ queryKey: ['lots'] });
      navigate(`/lots/${lot.code}`);
    },
  });

  if (isLoading) return <Spinner label="Loading…" />;
  if (!account) return <Navigate to="/sign-in?next=/lots/new" replace />;
  if (account.role !== 'dealer') return <Text>Only dealers register lots.</Text>;
  if (!canWrite) return <Text>You can register lots once the registrar has verified your account.</Text>;

  const change: Change = (key, value) => setDraft((d) => ({ ...d, [key]: value }));
  const error = (field: string) =>
    local[field] ?? (register.error instanceof ApiError ? register.error.fieldMessage(field) : undefined);

  const submit = () => {
    const { input, errors } = draftToRequest(draft);
    setLocal(errors);
    if (input) register.mutate(input);
    else focusFirstError(formRef.current);
  };

  return (
    <section className={styles.page} aria-labelledby="register-title">
      <Title2 as="h1" id="register-title">
        Register a lot
      </Title2>
      <Text>
        Registering writes the first entry of the lot’s roll. What you type is kept in this browser until the
        lot is registered; the private details only until you close the browser.
      </Text>
      <form
        ref={formRef}
        className={styles.form}
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <DescriptionSections draft={draft} change={change} error={error} />
        <Section
          id="lot-observations"
          title="Observations"
          lead="The physical clues, as you see them now. Leave a clue unanswered if you have not looked."
        >
          <ObservationChecklist
            value={draft.observations}
            onChange={(o) => change('observations', o)}
            error={(f) => error(`observations.${f}`)}
          />
        </Section>
        <PrivateSections draft={draft} change={change} error={error} />
        <ListingSection draft={draft} change={change} error={error} />
        {Object.keys(local).length ? (
          <MessageBar intent="error">
            <MessageBarBody>Some fields need attention; they are marked above.</MessageBarBody>
          </MessageBar>
        ) : (
          <FormError error={register.error} />
        )}
        <div className={styles.buttons}>
          <Button appearance="primary" type="submit" disabled={register.isPending}>
            {register.isPending ? 'Registering…' : 'Register the lot'}
          </Button>
          <Button
            onClick={() => {
              setDraft(EMPTY_DRAFT);
              setLocal({});
              register.reset();
            }}
          >
            Clear the form
          </Button>
          <Link to="/lots">Back to the inventory</Link>
        </div>
      </form>
    </section>
  );
}
