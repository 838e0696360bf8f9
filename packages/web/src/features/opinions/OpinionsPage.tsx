import { Button, makeStyles, Title2, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { useSession } from '../accounts/accounts.api';
import { FormError } from '../accounts/FormPage';
import { OpinionForm } from './OpinionForm';
import { OpinionsPanel } from './OpinionsPanel';
import { decorationOf, lotForAidQuery } from './opinions.api';

const useStyles = makeStyles({ root: { display: 'grid', gap: tokens.spacingVerticalXL } });

/** A lot's opinions on a page of their own: the panel, and the form for those who may write. */
export function OpinionsPage() {
  const styles = useStyles();
  const { code = '' } = useParams();
  const { account, canWrite } = useSession();
  const lot = useQuery(lotForAidQuery(code));
  const [open, setOpen] = useState(false);
  if (lot.error) return <FormError error={lot.error} />;
  if (!lot.data) return null;
  const l = lot.data;
  const mayOpine =
    canWrite &&
    (account?.role === 'dealer' || account?.role === 'assessor') &&
    (l.viewerIsHolder || l.listed);
  return (
    <div className={styles.root}>
      <Title2 as="h1">
        {l.title} · {l.displayCode}
      </Title2>
      <OpinionsPanel code={l.code} viewer={account ? { id: account.id, canWrite } : null} />
      {mayOpine &&
        (open ? (
          <OpinionForm
            code={l.code}
            observations={l.observations}
            decoration={decorationOf(l)}
            onDone={() => setOpen(false)}
          />
        ) : (
          <div>
            <Button appearance="primary" onClick={() => setOpen(true)}>
              {l.viewerIsHolder ? 'Record your attribution' : 'Record an opinion'}
            </Button>
          </div>
        ))}
    </div>
  );
}
