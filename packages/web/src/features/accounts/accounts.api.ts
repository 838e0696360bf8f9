import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/api';

export type Role = 'dealer' | 'assessor' | 'registrar';
export type AccountStatus = 'pending' | 'verified' | 'rejected' | 'suspended' | 'closed';

/** The signed-in account, as the server reports it. */
export interface Me {
  id: string;
  role: Role;
  status: AccountStatus;
  handle: string;
  displayName: string;
  email: string;
  business: string;
  town: string;
  country: string;
  emailVerified: boolean;
  verifiedSince: string | null;
  statusReason: string | null;
  createdAt: string;
}

export interface Message {
  message: string;
}

export interface Applicant {
  id: string;
  role: Role;
  status: AccountStatus;
  handle: string;
  displayName: string;
  email: string;
  business: string;
  town: string;
  country: string;
  address: string;
  website: string | null;
  tradeReferences: string;
  /** The document sent with the application (the registrar downloads it), or null. */
  document?: { sha256: string; mediaType: string; size: number; name: string } | null;
  appliedAt: string;
  verifiedSince: string | null;
  statusReason: string | null;
}

export interface RegistryPage {
  items: Applicant[];
  total: number;
  page: number;
  pageSize: number;
}

export interface RegistryParams {
  status: 'pending' | 'verified' | 'suspended' | 'rejected';
  sort: string;
  page: number;
  pageSize: number;
}

async function fetchSession(): Promise<Me | null> {
  const first = await api<{ account: Me | null }>('/api/auth/session');
  if (first.account) return first.account;
  // The access cookie may have lapsed while the refresh cookie still holds.
  try {
    return (await api<{ account: Me | null }>('/api/auth/session/refresh', { method: 'POST' })).account;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const sessionQuery = () =>
  queryOptions({ queryKey: ['session'], queryFn: fetchSession, staleTime: 60_000, retry: false });

export const registryQuery = (params: RegistryParams) =>
  queryOptions({
    queryKey: ['registry', 'accounts', params],
    queryFn: () =>
      api<RegistryPage>(
        `/api/registry/accounts?${new URLSearchParams({
          status: params.status,
          sort: params.sort,
          page: String(params.page),
          pageSize: String(params.pageSize),
        })}`,
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
  };
}

export const accountsApi = {
  signIn: (body: { email: string; password: string }) =>
    api<{ account: Me }>('/api/auth/sign-in', { method: 'POST', body }),
  signOut: () => api<void>('/api/auth/session/sign-out', { method: 'POST' }),
  /** Sends the application; with a document, as a form carrying the file in `document`. */
  signUp: (body: Record<string, string>, document?: File | null) => {
    if (!document) return api<Message>('/api/auth/sign-up', { method: 'POST', body });
    const form = new FormData();
    for (const [k, v] of Object.entries(body)) form.append(k, v);
    form.append('document', document);
    return api<Message>('/api/auth/sign-up', { method: 'POST', body: form });
  },
  verifyEmail: (token: string) => api<Message>('/api/auth/verify-email', { method: 'POST', body: { token } }),
  forgotPassword: (email: string) =>
    api<Message>('/api/auth/forgot-password', { method: 'POST', body: { email } }),
  resetPassword: (token: string, password: string) =>
    api<Message>('/api/auth/reset-password', { method: 'POST', body: { token, password } }),
  changePassword: (currentPassword: string, newPassword: string) =>
    api<Message>('/api/account/password', { method: 'POST', body: { currentPassword, newPassword } }),
  decide: (id: string, action: 'approve' | 'reject' | 'suspend' | 'reinstate', reason?: string) =>
    api<Applicant>(`/api/registry/accounts/${id}/${action}`, {
      method: 'POST',
      body: reason === undefined ? {} : { reason },
    }),
};
