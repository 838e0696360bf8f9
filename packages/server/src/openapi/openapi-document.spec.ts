import 'reflect-metadata';
import { RequestMethod, type Type } from '@nestjs/common';
import { HTTP_CODE_METADATA, METHOD_METADATA, MODULE_METADATA } from '@nestjs/common/constants';
import type { OpenAPIObject } from '@nestjs/swagger';
import { AppModule } from '../app.module';
import { buildOpenApiDocument } from './openapi-document';

// @nestjs/swagger's metadata keys for @ApiExcludeController / @ApiExcludeEndpoint (not exported).
const EXCLUDED_CONTROLLER = 'swagger/apiExcludeController';
const EXCLUDED_ENDPOINT = 'swagger/apiExcludeEndpoint';

interface Route {
  operationId: string;
  method: string;
  status: number;
}

/** Every controller reachable from a module through its imports (dynamic modules included). */
function controllersOf(root: Type<unknown>): Type<unknown>[] {
  const seen = new Set<unknown>();
  const found = new Set<Type<unknown>>();
  const walk = (entry: unknown): void => {
    if (!entry || seen.has(entry)) return;
    seen.add(entry);
    const dynamic = entry as { module?: Type<unknown>; controllers?: Type<unknown>[]; imports?: unknown[] };
    const cls = (typeof entry === 'function' ? entry : dynamic.module) as Type<unknown> | undefined;
    const controllers = [
      ...((cls && (Reflect.getMetadata(MODULE_METADATA.CONTROLLERS, cls) as Type<unknown>[])) ?? []),
      ...(typeof entry === 'function' ? [] : (dynamic.controllers ?? [])),
    ];
    for (const c of controllers) if (!Reflect.getMetadata(EXCLUDED_CONTROLLER, c)?.[0]) found.add(c);
    const imports = [
      ...((cls && (Reflect.getMetadata(MODULE_METADATA.IMPORTS, cls) as unknown[])) ?? []),
      ...(typeof entry === 'function' ? [] : (dynamic.imports ?? [])),
    ];
    for (const i of imports) walk(i);
  };
  walk(root);
  return [...found];
}

/** Each handler with the status Nest answers it with: @HttpCode, else 201 for POST and 200 for the rest. */
function routesOf(controller: Type<unknown>): Route[] {
  const proto = controller.prototype as Record<string, unknown>;
  return Object.getOwnPropertyNames(proto).flatMap((key) => {
    const handler = proto[key];
    if (key === 'constructor' || typeof handler !== 'function') return [];
    const method = Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod | undefined;
    if (method === undefined || Reflect.getMetadata(EXCLUDED_ENDPOINT, handler)) return [];
    const code = Reflect.getMetadata(HTTP_CODE_METADATA, handler) as number | undefined;
    return [
      {
        operationId: `${controller.name}_${key}`,
        method: RequestMethod[method].toLowerCase(),
        status: code ?? (method === RequestMethod.POST ? 201 : 200),
      },
    ];
  });
}

describe('the OpenAPI document', () => {
  let document: OpenAPIObject;
  let routes: Map<string, Route>;

  beforeAll(async () => {
    document = await buildOpenApiDocument();
    routes = new Map(
      controllersOf(AppModule)
        .flatMap(routesOf)
        .map((r) => [r.operationId, r]),
    );
  });

  const operations = () =>
    Object.entries(document.paths).flatMap(([path, item]) =>
      Object.entries(item as Record<string, { operationId?: string; responses?: object }>).map(
        ([method, op]) => ({ path, method, op }),
      ),
    );

  it('finds the handler of every operation', () => {
    const missing = operations().filter(({ op }) => !routes.has(op.operationId ?? ''));
    expect(missing.map(({ method, path }) => `${method} ${path}`)).toEqual([]);
    // And every route Nest registers is in the document.
    const documented = new Set(operations().map(({ op }) => op.operationId));
    const undocumented = [...routes.values()].filter((r) => !documented.has(r.operationId));
    expect(undocumented.map((r) => r.operationId)).toEqual([]);
  });

  it('documents each operation with the one success status its handler answers', () => {
    const wrong = operations().flatMap(({ path, method, op }) => {
      const route = routes.get(op.operationId ?? '');
      if (!route) return [];
      const documented = Object.keys(op.responses ?? {}).filter((s) => /^2\d\d$/.test(s));
      return documented.length === 1 && documented[0] === String(route.status)
        ? []
        : [
            `${method.toUpperCase()} ${path}: documented ${documented.join(', ') || 'none'}, answers ${route.status}`,
          ];
    });
    expect(wrong).toEqual([]);
  });

  it('describes the body of every answer but a 204', () => {
    const bare = operations().flatMap(({ path, method, op }) =>
      Object.entries(
        (op.responses ?? {}) as Record<string, { content?: Record<string, { schema?: object }> }>,
      )
        .filter(([status]) => /^2\d\d$/.test(status) && status !== '204')
        .filter(
          ([, r]) =>
            !r.content ||
            Object.values(r.content).some((c) => !c.schema || Object.keys(c.schema).length === 0),
        )
        .map(([status]) => `${method.toUpperCase()} ${path} ${status}`),
    );
    expect(bare).toEqual([]);
    const schemas = (document.components?.schemas ?? {}) as Record<
      string,
      { type?: string; properties?: object; additionalProperties?: unknown }
    >;
    const empty = Object.entries(schemas)
      .filter(([, s]) => s.type === 'object' && !s.properties && !s.additionalProperties)
      .map(([name]) => name);
    expect(empty).toEqual([]);
  });

  it('checks POST routes in particular (new lots, offers, sales and opinions answer 201)', () => {
    const post = operations().filter(({ method }) => method === 'post');
    expect(post.length).toBeGreaterThan(30);
    const created = (path: string) => Object.keys(document.paths[path]?.post?.responses ?? {});
    for (const path of [
      '/api/lots',
      '/api/transfers/offers',
      '/api/transfers/sales',
      '/api/lots/{code}/opinions',
    ])
      expect(created(path)).toEqual(['201']);
  });
});
