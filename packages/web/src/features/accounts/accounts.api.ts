import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { operations } from '../../api/schema';
import type { Schemas } from '../../api/types';
import { api, ApiError } from '../../lib/api';
import { setOutboxAccount } from '../../lib/outbox';

/** The signed-in account, as the server reports it. */
export type Me = Schemas['MeResponse'];
export type Role = Me['role'];
export type AccountStatus = Me['status'];
export type Message = Schemas['MessageResponse'];
export type Applicant = Schemas['ApplicantResponse'];
export type RegistryPage = Schemas['RegistryPage'];

type RegistryQuery = NonNullable<operations['RegistryController_list']['parameters']['query']>;

export interface RegistryParams {
  status: 'pending' | 'verified' | 'suspended' | 'rejected';
  sort: string;
  page: number;
  pageSize: number;
}

/** The signed-in account, and whether it is only remembered because the server cannot be reached. */
export type Session = Me & { offline?: boolean };

const REMEMBERED = 'beadroll.session';

/**
 * Keeps the signed-in account on this browser (null forgets it) and tells the list of writes
 * kept for a signal who is signed in. A page opened with no signal, at a fair stand, then still
 * knows the dealer; signing out forgets it. The e-mail address and the registrar's reason are
 * not kept: the header and the dealer's pages need neither with no signal.
 */
export function rememberSession(account: Me | null): void {
  setOutboxAccount(account?.id ?? null);
  try {
    if (account) {
      const { email: _email, statusReason: _reason, ...kept } = account;
      localStorage.setItem(REMEMBERED, JSON.stringify(kept));
    } else localStorage.removeItem(REMEMBERED);
  } catch {
    // storage refused (private window): nothing is remembered
  }
}

function rememberedSession(): Me | null {
  try {
    const text = localStorage.getItem(REMEMBERED);
    const kept = text ? (JSON.parse(text) as Omit<Me, 'email' | 'statusReason'>) : null;
    return kept && typeof kept.id === 'string' ? { ...kept, email: '', statusReason: null } : null;
  } catch {
    return null;
  }
}

async function askSession(): Promise<Me | null> {
  const first = await answer(client.GET('/api/auth/session'));
  if (first.account) return first.account;
  // The access cookie may have lapsed while the refresh cookie still holds.
  try {
    return (await answer(client.POST('/api/auth/session/refresh'))).account;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

async function fetchSession(): Promise<Session | null> {
  try {
    const account = await askSession();
    rememberSession(account);
    return account;
  } catch (err) {
    // No answer at all (no signal): the account last signed in here, marked as not checked.
    const remembered = err instanceof ApiError && err.status === 0 ? rememberedSession() : null;
    if (!remembered) throw err;
    setOutboxAccount(remembered.id);
    return { ...remembered, offline: true };
  }
}

export const sessionQuery = () =>
  queryOptions({
    queryKey: ['session'],
    queryFn: fetchSession,
    staleTime: 60_000,
    retry: false,
    // Asked with no signal too: the answer is then the remembered account.
    networkMode: 'always',
  });

export const registryQuery = (params: RegistryParams) =>
  queryOptions({
    queryKey: ['registry', 'accounts', params],
    queryFn: () =>
      answer(
        // The sort comes from the page's address; the server answers an unknown one with a 400.
        client.GET('/api/registry/accounts', { params: { query: params as RegistryQuery } }),
      ),
    placeholderData: keepPreviousData,
  });

/**
 * The signed-in principal for any feature: `account` is null when nobody is signed in
 * (also while the session is loading; check `isLoading`).
 */
export function useSession() {
  const q = useQuery(sessionQuery());
  const account = q.data ?? null;
  return {
    account,
    isLoading: q.isLoading,
    signedIn: account !== null,
    /** Verified by the registrar: may write to rolls. */
    canWrite: account?.status === 'verified',
    /** The account is remembered from an earlier visit: the server cannot be reached now. */
    offline: account?.offline === true,
  };
}

export const accountsApi = {
  signIn: (body: Schemas['SignInDto']) => answer(client.POST('/api/auth/sign-in', { body })),
  signOut: () => answer(client.POST('/api/auth/session/sign-out')),
  /**
   * Sends the application; with a document, as a form carrying the file in `document`. The
   * form sends the fields it has; the server names any that is missing or wrong.
   */
  signUp: (body: Record<string, string>, document?: File | null) => {
    if (!document) return answer(client.POST('/api/auth/sign-up', { body: body as Schemas['SignUpDto'] }));
    const form = new FormData();
    for (const [k, v] of Object.entries(body)) form.append(k, v);
    form.append('document', document);
    return api<Message>('/api/auth/sign-up', { method: 'POST', body: form });
  },
  verifyEmail: (token: string) => answer(client.POST('/api/auth/verify-email', { body: { token } })),
  forgotPassword: (email: string) => answer(client.POST('/api/auth/forgot-password', { body: { email } })),
  resetPassword: (token: string, password: string) =>
    answer(client.POST('/api/auth/reset-password', { body: { token, password } })),
  changePassword: (currentPassword: string, newPassword: string) =>
    answer(client.POST('/api/account/password', { body: { currentPassword, newPassword } })),
  decide: (id: string, action: 'approve' | 'reject' | 'suspend' | 'reinstate', reason?: string) =>
    answer(
      client.POST(`/api/registry/accounts/{id}/${action}`, {
        params: { path: { id } },
        body: reason === undefined ? undefined : { reason },
      }),
    ),
};
