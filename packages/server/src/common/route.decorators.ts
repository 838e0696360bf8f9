import { applyDecorators, Get, Header, HttpCode, Post, Put, type Type, UseGuards } from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiCreatedResponse,
  ApiOkResponse,
  ApiOperation,
  ApiProduces,
} from '@nestjs/swagger';
import { Public, type Role, Roles, RollWriter } from '../auth/auth.decorators';
import { RateLimitGuard } from '../auth/rate-limit.guard';

/** The response body of a route: one DTO class, or a list of them. */
export type RouteBody = Type<unknown> | [Type<unknown>];

/** Summary and 200 body in the OpenAPI document. */
export const Documented = (summary: string, type: RouteBody) =>
  applyDecorators(ApiOperation({ summary }), ApiOkResponse({ type }));

/** Summary and 201 body: a POST that keeps Nest's own status for a new thing. */
const DocumentedCreated = (summary: string, type: RouteBody) =>
  applyDecorators(ApiOperation({ summary }), ApiCreatedResponse({ type }));

/** The roll-writer mark, after an optional role check on the route itself. */
const writer = (roles: Role[]) => applyDecorators(...(roles.length ? [Roles(...roles)] : []), RollWriter());

/** A read: GET answering 200 with `type`. */
export const Read = (path: string | undefined, summary: string, type: RouteBody) =>
  applyDecorators(Get(path), Documented(summary, type));

/**
 * A POST that acts on something that already exists (approve, close, accept...): it answers
 * 200 with the changed thing, not 201.
 */
export const Action = (path: string, summary: string, type: RouteBody) =>
  applyDecorators(Post(path), HttpCode(200), Documented(summary, type));

/**
 * A dealer's write on a lot's roll (POST or PUT), answering with `type`. POST keeps Nest's
 * 201; the roll-writer mark has the account's standing checked on every request.
 */
export const DealerRollWrite = (
  method: 'POST' | 'PUT',
  path: string | undefined,
  summary: string,
  type: RouteBody,
) =>
  applyDecorators(
    ...(method === 'POST'
      ? [Post(path), DocumentedCreated(summary, type)]
      : [Put(path), Documented(summary, type)]),
    writer(['dealer']),
  );

/** A POST that writes a new entry on a roll (Nest's 201), for `roles` when given. */
export const RollWrite = (path: string | undefined, summary: string, type: RouteBody, ...roles: Role[]) =>
  applyDecorators(Post(path), writer(roles), DocumentedCreated(summary, type));

/** An {@link Action} that writes on a roll (accept, withdraw...), for `roles` when given. */
export const RollAction = (path: string, summary: string, type: RouteBody, ...roles: Role[]) =>
  applyDecorators(Action(path, summary, type), writer(roles));

/** A POST whose work goes on after the answer (a mail, a review): 202 with `type`. */
export const Accepted = (path: string, summary: string, type: RouteBody) =>
  applyDecorators(Post(path), HttpCode(202), ApiOperation({ summary }), ApiAcceptedResponse({ type }));

/** Open without a sign-in, and limited per address against guessing and flooding. */
export const RateLimitedPublic = () => applyDecorators(Public(), UseGuards(RateLimitGuard));

/** GET `export`: a list as a spreadsheet file (CSV or XLSX), never kept in a cache. */
export const SheetDownload = (summary: string) =>
  applyDecorators(
    Get('export'),
    Header('Cache-Control', 'no-store'),
    ApiOperation({ summary }),
    FileAnswer(
      'the list as a file',
      'text/csv',
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    ),
  );

/** A 200 answer that is plain text (`text/plain`), described in the OpenAPI document. */
export const TextAnswer = (description: string) =>
  applyDecorators(ApiProduces('text/plain'), ApiOkResponse({ description, schema: { type: 'string' } }));

/** A 200 answer that is a file of one of `types`, described in the OpenAPI document as bytes. */
export const FileAnswer = (description: string, ...types: string[]) =>
  applyDecorators(
    ApiProduces(...types),
    ApiOkResponse({ description, schema: { type: 'string', format: 'binary' } }),
  );
