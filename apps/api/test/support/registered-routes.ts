import { RequestMethod } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA, ROUTE_ARGS_METADATA } from '@nestjs/common/constants';
import { RouteParamtypes } from '@nestjs/common/enums/route-paramtypes.enum';
import { ModulesContainer } from '@nestjs/core';
import { type TestContext } from './test-app';

export interface RegisteredRoute {
  method: string;
  /** OpenAPI form: /api/jobs/{id} */
  path: string;
  /** Express form, as Nest registered it: /api/jobs/:id */
  route: string;
  /** The handler takes @Body() or an uploaded file. */
  readsBody: boolean;
}

/** Every route Nest registered, read from the controllers' metadata, with whether its handler reads a body. */
export function registeredRoutes(ctx: TestContext): RegisteredRoute[] {
  const out: RegisteredRoute[] = [];
  const join = (...parts: string[]) =>
    '/' +
    parts
      .flatMap((p) => p.split('/'))
      .filter(Boolean)
      .join('/');
  const bodyTypes = new Set<number>([
    RouteParamtypes.BODY,
    RouteParamtypes.RAW_BODY,
    RouteParamtypes.FILE,
    RouteParamtypes.FILES,
  ]);
  for (const mod of ctx.app.get(ModulesContainer).values()) {
    for (const wrapper of mod.controllers.values()) {
      const type = wrapper.metatype as (new (...args: never[]) => unknown) | null;
      if (!type) continue;
      const bases = [Reflect.getMetadata(PATH_METADATA, type) as string | string[]].flat();
      for (const name of Object.getOwnPropertyNames(type.prototype)) {
        const handler = (type.prototype as Record<string, unknown>)[name];
        if (name === 'constructor' || typeof handler !== 'function') continue;
        const method = Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod | undefined;
        if (method === undefined) continue;
        const args = (Reflect.getMetadata(ROUTE_ARGS_METADATA, type, name) ?? {}) as Record<string, unknown>;
        // Keys are "<paramtype>:<index>" (custom decorators add a suffix after the paramtype).
        const readsBody = Object.keys(args).some((k) => bodyTypes.has(Number(k.split(':')[0])));
        const paths = [Reflect.getMetadata(PATH_METADATA, handler) as string | string[]].flat();
        for (const base of bases) {
          for (const p of paths) {
            out.push({
              method: RequestMethod[method].toLowerCase(),
              path: join('api', base ?? '', p ?? '').replace(/:(\w+)/g, '{$1}'),
              route: join('api', base ?? '', p ?? ''),
              readsBody,
            });
          }
        }
      }
    }
  }
  return out;
}
