import type { CookieOptions, Response } from 'express';
import type { AppConfig } from '../config/app-config';

export const ACCESS_COOKIE = 'beadroll_access';
export const REFRESH_COOKIE = 'beadroll_refresh';
/** The refresh token is sent only to the session routes (refresh and sign-out). */
export const REFRESH_PATH = '/api/auth/session';

function base(config: AppConfig): CookieOptions {
  return { httpOnly: true, sameSite: 'lax', secure: config.session.secureCookies };
}

export function setSessionCookies(res: Response, config: AppConfig, access: string, refresh: string): void {
  res.cookie(ACCESS_COOKIE, access, {
    ...base(config),
    path: '/',
    maxAge: config.session.accessTtlSeconds * 1000,
  });
  res.cookie(REFRESH_COOKIE, refresh, {
    ...base(config),
    path: REFRESH_PATH,
    maxAge: config.session.refreshTtlSeconds * 1000,
  });
}

export function clearSessionCookies(res: Response, config: AppConfig): void {
  res.clearCookie(ACCESS_COOKIE, { ...base(config), path: '/' });
  res.clearCookie(REFRESH_COOKIE, { ...base(config), path: REFRESH_PATH });
}
