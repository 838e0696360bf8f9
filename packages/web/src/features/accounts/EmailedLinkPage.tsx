import { Link } from '@fluentui/react-components';
import { useMutation } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Link as RouterLink, useSearchParams } from 'react-router-dom';
import { RequestFormPage } from '../../common/ui/FormPage';

/**
 * A page opened from an e-mailed link that carries `?token=`. Nothing changes until the button
 * is pressed (link scanners only GET); then the server's answer shows with a way to sign in.
 */
export function EmailedLinkPage({
  title,
  lead,
  submitLabel,
  doneTitle,
  send,
  fields,
}: {
  title: string;
  lead: string;
  submitLabel: string;
  doneTitle: string;
  send: (token: string) => Promise<{ message: string }>;
  /** The form's own fields, given the failed request to show a field's reason beside it. */
  fields?: (error: unknown) => ReactNode;
}) {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const mutation = useMutation({ mutationFn: () => send(token) });
  return (
    <RequestFormPage
      title={title}
      lead={lead}
      request={mutation}
      submitLabel={submitLabel}
      submitDisabled={!token}
      doneTitle={doneTitle}
      after={
        <Link as="span">
          <RouterLink to="/sign-in">Sign in</RouterLink>
        </Link>
      }
    >
      {fields?.(mutation.error)}
    </RequestFormPage>
  );
}
