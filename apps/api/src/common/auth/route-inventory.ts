import { RequestMethod, type INestApplication } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA } from '@nestjs/common/constants.js';
import { ModulesContainer } from '@nestjs/core';
import type { Role } from '@hitchbook/shared/roles';
import { ALLOWED_ROLES, IS_PUBLIC } from './decorators.js';

export interface RouteInfo {
  method: string;
  path: string;
  controller: string;
  handler: string;
  isPublic: boolean;
  roles: Role[] | null;
}

function joinPath(...parts: Array<string | string[] | undefined>): string {
  const segs = parts.flatMap((p) => (Array.isArray(p) ? p[0] : p) ?? '').flatMap((p) => p.split('/')).filter(Boolean);
  return `/${segs.join('/')}`;
}

/** Every route the application serves, with the access it declares: the basis of the access tests. */
export function listRoutes(app: INestApplication, prefix = 'api'): RouteInfo[] {
  const routes: RouteInfo[] = [];
  for (const moduleRef of app.get(ModulesContainer).values()) {
    for (const wrapper of moduleRef.controllers.values()) {
      const type = wrapper.metatype as (new (...args: never[]) => unknown) | undefined;
      if (!type) continue;
      const base = Reflect.getMetadata(PATH_METADATA, type) as string | string[] | undefined;
      const proto = type.prototype as Record<string, unknown>;
      for (const name of Object.getOwnPropertyNames(proto)) {
        const handler = proto[name];
        if (name === 'constructor' || typeof handler !== 'function') continue;
        const sub = Reflect.getMetadata(PATH_METADATA, handler) as string | string[] | undefined;
        const method = Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod | undefined;
        if (sub === undefined || method === undefined) continue;
        const isPublic = Boolean(Reflect.getMetadata(IS_PUBLIC, handler) ?? Reflect.getMetadata(IS_PUBLIC, type));
        const roles = (Reflect.getMetadata(ALLOWED_ROLES, handler) ?? Reflect.getMetadata(ALLOWED_ROLES, type) ?? null) as Role[] | null;
        routes.push({ method: RequestMethod[method], path: joinPath(prefix, base, sub), controller: type.name, handler: name, isPublic, roles });
      }
    }
  }
  return routes.sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method));
}
