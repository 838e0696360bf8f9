import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  Field,
  Input,
  makeStyles,
  Radio,
  RadioGroup,
  Select,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';
import { fieldError, FormError } from '../../shared/ui/FormPage';
import { MoneyField } from '../../shared/ui/MoneyField';
import {
  dealerSearchQuery,
  heldLotsQuery,
  type Offer,
  type Invitation,
  priceProblem,
  toMinorUnits,
  transfersApi,
} from './transfers.api';

const useStyles = makeStyles({
  form: { display: 'grid', gap: tokens.spacingVerticalM },
  results: { display: 'grid', gap: tokens.spacingVerticalXS },
  sub: { color: tokens.colorNeutralForeground3 },
});

/**
 * Offers a lot to another dealer (found by name, handle or business) or to an e-mail address.
 * The price is sealed: only the two dealers ever see it.
 */
export function OfferDialog({
  code,
  title,
  onClose,
  onDone,
}: {
  /** The lot; when absent the dialog asks for one of the dealer's held lots. */
  code?: string;
  title?: string;
  onClose: () => void;
  onDone?: (made: { offer?: Offer; invitation?: Invitation }) => void;
}) {
  const styles = useStyles();
  const client = useQueryClient();
  const [lot, setLot] = useState(code ?? '');
  const held = useQuery({ ...heldLotsQuery(), enabled: !code });
  const [mode, setMode] = useState<'dealer' | 'email'>('dealer');
  const [q, setQ] = useState('');
  const [recipient, setRecipient] = useState('');
  const [email, setEmail] = useState('');
  const [note, setNote] = useState('');
  const [amount, setAmount] = useState('');
  const [currency, setCurrency] = useState('EUR');
  const search = useQuery(dealerSearchQuery(q));
  const send = useMutation({
    mutationFn: () => {
      const minor = amount.trim() ? toMinorUnits(amount, currency) : undefined;
      if (minor === null)
        throw new ApiError(400, 'validation', 'Check the price.', [
          { field: 'price', reason: priceProblem(amount, currency) ?? 'Enter the price' },
        ]);
      return transfersApi.offer({
        lot,
        ...(mode === 'dealer' ? { recipient } : { email }),
        ...(note.trim() ? { note: note.trim() } : {}),
        ...(minor !== undefined ? { price: { amount: minor, currency } } : {}),
      });
    },
    onSuccess: async (made) => {
      await client.invalidateQueries({ queryKey: ['transfers'] });
      await client.invalidateQueries({ queryKey: ['lots'] });
      onDone?.(made);
      onClose();
    },
  });
  return (
    <Dialog open onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface>
        <form
          className={styles.form}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            send.mutate();
          }}
        >
          <DialogBody>
            <DialogTitle>Offer {title ? `“${title}”` : 'this lot'} to another dealer</DialogTitle>
            <DialogContent className={styles.form}>
              {code ? null : (
                <Field label="Lot" required validationMessage={fieldError(send.error, 'lot')}>
                  <Select value={lot} onChange={(_, d) => setLot(d.value)}>
                    <option value="">Choose one of your lots…</option>
                    {(held.data?.items ?? []).map((l) => (
                      <option key={l.code} value={l.code}>
                        {l.title} ({l.displayCode})
                      </option>
                    ))}
                  </Select>
                </Field>
              )}
              <RadioGroup
                value={mode}
                onChange={(_, d) => setMode(d.value as 'dealer' | 'email')}
                layout="horizontal"
                aria-label="Offer to"
              >
                <Radio value="dealer" label="A dealer on Beadroll" />
                <Radio value="email" label="An e-mail address" />
              </RadioGroup>
              {mode === 'dealer' ? (
                <Field
                  label="Find the dealer by name, handle or business"
                  validationMessage={fieldError(send.error, 'recipient')}
                >
                  <Input value={q} onChange={(_, d) => setQ(d.value)} placeholder="at least 2 letters" />
                </Field>
              ) : (
                <Field
                  label="Their e-mail address"
                  hint="If they have no verified account yet, they get an invitation; the offer is made once the registrar verifies them."
                  validationMessage={fieldError(send.error, 'email')}
                >
                  <Input type="email" value={email} onChange={(_, d) => setEmail(d.value)} />
                </Field>
              )}
              {mode === 'dealer' && search.data ? (
                search.data.items.length ? (
                  <RadioGroup
                    className={styles.results}
                    value={recipient}
                    onChange={(_, d) => setRecipient(d.value)}
                    aria-label="Dealers found"
                  >
                    {search.data.items.map((p) => (
                      <Radio
                        key={p.id}
                        value={p.id}
                        label={`${p.displayName} — ${p.business}, ${p.town} (@${p.handle})`}
                      />
                    ))}
                  </RadioGroup>
                ) : (
                  <Text className={styles.sub}>
                    No verified dealer matches. Try an e-mail address instead.
                  </Text>
                )
              ) : null}
              <Field
                label="Note (optional)"
                hint="Written on the lot’s history: everyone who reads the history sees it."
                validationMessage={fieldError(send.error, 'note')}
              >
                <Textarea value={note} onChange={(_, d) => setNote(d.value)} resize="vertical" />
              </Field>
              <MoneyField
                label="Agreed price (optional)"
                hint="Sealed: only you and the other dealer see it; never in e-mails or on the public page."
                amount={amount}
                currency={currency}
                onAmount={setAmount}
                onCurrency={setCurrency}
                validationMessage={fieldError(send.error, 'price')}
              />
              <FormError error={send.error} />
            </DialogContent>
            <DialogActions>
              <Button onClick={onClose}>Cancel</Button>
              <Button
                appearance="primary"
                type="submit"
                disabled={send.isPending || !lot || (mode === 'dealer' ? !recipient : !email.trim())}
              >
                Send the offer
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
