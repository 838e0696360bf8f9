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
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { PhotoPicker, uploadPending, type PendingPhoto } from '../exhibits/PhotoPicker';
import { ApiError } from '../../lib/api';
import { focusFirstError } from '../../common/ui/focus-first-error';
import { useSession } from '../accounts/accounts.api';
import { FormError } from '../../common/ui/FormPage';
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
  const [params] = useSearchParams();
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const [registered, setRegistered] = useState<string | null>(null);
  const [uploadFailed, setUploadFailed] = useState(0);
  const updatePhoto = (id: string, patch: Partial<PendingPhoto>) =>
    setPhotos((ps) => ps.map((p) => (p.id === id ? { ...p, ...patch } : p)));
  const sendPhotos = async (code: string) => {
    const failed = await uploadPending(code, photos, updatePhoto);
    setUploadFailed(failed);
    await client.invalidateQueries({ queryKey: ['lots'] });
    if (failed === 0) navigate(`/lots/${code}`);
  };
  const register = useMutation({
    mutationFn: lotsApi.register,
    onError: () => focusFirstError(formRef.current),
    onSuccess: async (lot) => {
      clearDraft();
      await client.invalidateQueries({ queryKey: ['lots'] });
      if (photos.length === 0) {
        navigate(`/lots/${lot.code}`, { state: { registered: true } });
        return;
      }
      // The lot exists: its photos go up now, in the same flow, each with its progress.
      setRegistered(lot.code);
      await sendPhotos(lot.code);
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
    if (registered) return;
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
      {params.get('like') ? (
        <MessageBar intent="info">
          <MessageBarBody>
            The description and observations are copied from the lot you were on. Photos and private details
            are not copied: add this lot’s own.
          </MessageBarBody>
        </MessageBar>
      ) : null}
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
        <Section
          id="lot-photos"
          title="Photos"
          lead="Choose photos or take them with your phone’s camera. They are added to the roll as exhibits as soon as the lot is registered."
        >
          <PhotoPicker
            photos={photos}
            onChange={setPhotos}
            disabled={registered !== null || register.isPending}
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
        {registered && uploadFailed > 0 ? (
          <MessageBar intent="warning">
            <MessageBarBody>
              The lot is registered, but{' '}
              {uploadFailed === 1 ? 'one photo was' : `${uploadFailed} photos were`} not added.{' '}
              <Button size="small" onClick={() => void sendPhotos(registered)}>
                Try again
              </Button>{' '}
              <Link to={`/lots/${registered}`}>Go to the lot</Link>
            </MessageBarBody>
          </MessageBar>
        ) : null}
        <div className={styles.buttons}>
          <Button appearance="primary" type="submit" disabled={register.isPending || registered !== null}>
            {register.isPending
              ? 'Registering…'
              : registered
                ? 'Adding the photos…'
                : photos.length
                  ? `Register the lot and add ${photos.length === 1 ? 'its photo' : `its ${photos.length} photos`}`
                  : 'Register the lot'}
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
