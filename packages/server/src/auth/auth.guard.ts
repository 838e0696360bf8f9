import { type ExecutionContext, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import type { Request } from 'express';
import { AppError } from '../common/app-error';
import { IS_PUBLIC, type Principal, ROLES, ROLL_WRITER, type Role } from './auth.decorators';
import { ACCESS_COOKIE } from './cookies';

/** Header every state-changing request must carry (a cross-site form cannot set it). */
export const CSRF_HEADER = 'x-beadroll-request';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

type AuthRequest = Request & { account?: Principal & { sessionId?: string } };

/**
 * The global guard: CSRF header on every non-GET request; the account behind the access cookie,
 * loaded from the database into `req.account`; a sign-in required unless `@Public()`; `@Roles`
 * and `@RollWriter` checked against the freshly loaded role and status.
 */
@Injectable()
export class AccessGuard extends AuthGuard('access') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override getAuthenticateOptions() {
    return { session: false, property: 'account' };
  }

  override handleRequest<T>(err: unknown, user: T): T {
    // A bad or expired token counts as no sign-in; whether that is allowed is decided below. A
    // failure to look the session up (the database is away) is not a sign-out: the client should
    // try again, not forget who it is.
    if (err)
      throw new AppError(
        'unavailable',
        'Beadroll cannot check your sign-in just now. Please try again in a moment.',
      );
    return (user || undefined) as T;
  }

  override async canActivate(ctx: ExecutionContext): Promise<boolean> {
    if (ctx.getType() !== 'http') return true;
    const req = ctx.switchToHttp().getRequest<AuthRequest>();
    if (!SAFE_METHODS.has(req.method) && req.get(CSRF_HEADER) !== '1') {
      throw new AppError('csrf', 'This request is missing the X-Beadroll-Request header.');
    }
    const targets = [ctx.getHandler(), ctx.getClass()];
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets) ?? false;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES, targets);
    const writer = this.reflector.getAllAndOverride<boolean>(ROLL_WRITER, targets) ?? false;

    req.account = undefined;
    if (req.cookies?.[ACCESS_COOKIE]) await super.canActivate(ctx);
    const account = req.account as AuthRequest['account'];

    if (!account) {
      if (isPublic && !roles && !writer) return true;
      throw new AppError('unauthenticated', 'Please sign in.');
    }
    if (roles && !roles.includes(account.role)) {
      throw new AppError('forbidden', 'Your account cannot do this.');
    }
    if (writer && account.status !== 'verified') {
      throw new AppError(
        'not_verified',
        account.status === 'suspended'
          ? 'Your account is suspended: it can read but not write to any roll.'
          : 'Your account must be verified by the registrar before it can write to a roll.',
      );
    }
    return true;
  }
}
