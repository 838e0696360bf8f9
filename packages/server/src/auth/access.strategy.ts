import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import type { Request } from 'express';
import { Strategy } from 'passport-jwt';
import { ACCESS_COOKIE } from './cookies';
import { JWT_ALGORITHM } from './jwt-secret';
import { type AccessClaims, SessionsService } from './sessions.service';

export const JWT_SECRET = Symbol('JWT_SECRET');

function fromCookie(req: Request): string | null {
  const value: unknown = req.cookies?.[ACCESS_COOKIE];
  return typeof value === 'string' && value.length > 0 && value.length < 4096 ? value : null;
}

/** Reads the access token from its cookie only (never a header or query), with the algorithm pinned. */
@Injectable()
export class AccessStrategy extends PassportStrategy(Strategy, 'access') {
  constructor(
    @Inject(JWT_SECRET) secret: string,
    private readonly sessions: SessionsService,
  ) {
    super({
      jwtFromRequest: fromCookie,
      secretOrKey: secret,
      algorithms: [JWT_ALGORITHM],
      ignoreExpiration: false,
    });
  }

  async validate(payload: Partial<AccessClaims>) {
    if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string') return false;
    return (await this.sessions.principalFor({ sub: payload.sub, sid: payload.sid })) ?? false;
  }
}
