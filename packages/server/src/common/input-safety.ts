import { type ArgumentMetadata, Injectable, type PipeTransform } from '@nestjs/common';
import express, { type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import { AppError, type ErrorCode, type FieldProblem } from './app-error';
import { requestIdOf, tagRequest } from './request-id.middleware';

/** Limits every request's input is held to before any validation runs. */
export interface InputLimits {
  /** Largest JSON or form body, in bytes. */
  maxBytes: number;
  /** Deepest nesting of objects and lists. */
  maxDepth: number;
}

// A NUL, or a UTF-16 surrogate without its partner: neither can be stored as text in PostgreSQL
// nor written as canonical JSON (RFC 8785 §3.2.2.2 requires well-formed Unicode strings).
const NUL = String.fromCharCode(0);
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function textProblem(text: string): string | null {
  if (text.includes(NUL))
    return 'contains an invisible control character (NUL) that cannot be stored; retype it';
  if (LONE_SURROGATE.test(text))
    return 'contains a broken character (half of an emoji or symbol); retype it or paste it again';
  return null;
}

/**
 * The first problem in a parsed request value, walking it without recursion so no nesting can
 * exhaust the stack: nesting deeper than `maxDepth`, or a string (value or key) holding a NUL or
 * a lone surrogate. `root` names the value itself (a field path like `description.title` below it).
 */
export function findInputProblem(
  value: unknown,
  maxDepth: number,
  root = '',
  whole = 'body',
): FieldProblem | null {
  const stack: Array<{ v: unknown; path: string; depth: number }> = [{ v: value, path: root, depth: 0 }];
  const name = (path: string) => path || whole;
  while (stack.length > 0) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === 'string') {
      const reason = textProblem(v);
      if (reason) return { field: name(path), reason };
      continue;
    }
    if (v === null || typeof v !== 'object') continue;
    if (depth >= maxDepth)
      return { field: name(path), reason: `is nested too deeply (more than ${maxDepth} levels)` };
    for (const [k, child] of Object.entries(v as Record<string, unknown>)) {
      const childPath = path ? `${path}.${k}` : k;
      const keyReason = textProblem(k);
      if (keyReason) return { field: name(path), reason: `has a field name that ${keyReason}` };
      stack.push({ v: child, path: childPath, depth: depth + 1 });
    }
  }
  return null;
}

function refuse(
  req: Request,
  res: Response,
  status: number,
  code: ErrorCode,
  message: string,
  fields?: FieldProblem[],
): void {
  if (requestIdOf(req) === '-') tagRequest(req, res);
  res
    .status(status)
    .json({ error: { code, message, ...(fields ? { fields } : {}), requestId: requestIdOf(req) } });
}

/** Turns a body-parser failure into the stable error body, never a 500. */
function parserError(err: unknown, req: Request, res: Response, limits: InputLimits): void {
  const type = (err as { type?: string }).type;
  const status = Number((err as { status?: number }).status) || 400;
  if (type === 'entity.too.large')
    return refuse(req, res, 413, 'payload_too_large', `The request is larger than ${limits.maxBytes} bytes.`);
  if (type === 'entity.parse.failed')
    return refuse(req, res, 400, 'validation', 'The request is not valid JSON.', [
      { field: 'body', reason: 'is not valid JSON' },
    ]);
  if (type === 'encoding.unsupported' || type === 'charset.unsupported')
    return refuse(req, res, 415, 'unsupported_media_type', 'Send the request as UTF-8 JSON.');
  refuse(
    req,
    res,
    status >= 400 && status < 500 ? status : 400,
    'bad_request',
    'The request could not be read.',
  );
}

/**
 * The JSON and form body parsers with a size limit, followed by the one rule for hostile input:
 * nesting beyond `maxDepth`, and strings with a NUL or a lone surrogate anywhere in the body or
 * query, are a 400 naming the field before any guard, pipe or validation sees the request.
 * Named like Express's own parsers so Nest does not add its defaults.
 */
export function bodyParsers(limits: InputLimits): RequestHandler[] {
  const json = express.json({ limit: limits.maxBytes });
  const form = express.urlencoded({ extended: false, limit: limits.maxBytes });
  const guarded = (parse: RequestHandler): RequestHandler =>
    function (req: Request, res: Response, next: NextFunction) {
      parse(req, res, (err?: unknown) => {
        if (err) return parserError(err, req, res, limits);
        const problem =
          findInputProblem(req.body, limits.maxDepth) ??
          findInputProblem({ ...(req.query as object) }, limits.maxDepth, '', 'query');
        if (problem)
          return refuse(req, res, 400, 'validation', `${problem.field}: ${problem.reason}`, [problem]);
        next();
      });
    };
  const jsonParser = guarded(json);
  const urlencodedParser = guarded(form);
  Object.defineProperty(jsonParser, 'name', { value: 'jsonParser' });
  Object.defineProperty(urlencodedParser, 'name', { value: 'urlencodedParser' });
  return [jsonParser, urlencodedParser];
}

/**
 * The same rule for what reaches a handler by other ways (multipart form fields, route
 * parameters), applied as a global pipe ahead of validation.
 */
@Injectable()
export class InputSafetyPipe implements PipeTransform {
  constructor(private readonly maxDepth: number) {}

  transform(value: unknown, meta: ArgumentMetadata): unknown {
    if (meta.type === 'custom') return value;
    const problem = findInputProblem(value, this.maxDepth, meta.data ?? '', meta.type);
    if (problem) throw AppError.validation([problem]);
    return value;
  }
}
