import type { INestApplication } from '@nestjs/common';
import { ROUTE_ARGS_METADATA } from '@nestjs/common/constants.js';
import { RouteParamtypes } from '@nestjs/common/enums/route-paramtypes.enum.js';
import { ModulesContainer } from '@nestjs/core';
import type { z } from 'zod';
import { listRoutes, type RouteInfo } from '../common/auth/route-inventory.js';
import { ZodPipe } from '../common/validation/zod.pipe.js';

export interface WriteRoute extends RouteInfo {
  /** The zod schema its @Body() pipe validates with, or null when the route reads no JSON body. */
  bodySchema: z.ZodType | null;
  /** The zod schema its @Query() pipe validates with, or null when it reads no query. */
  querySchema: z.ZodType | null;
}

const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function controllerTypes(app: INestApplication): Map<string, Function> {
  const types = new Map<string, Function>();
  for (const moduleRef of app.get(ModulesContainer).values()) {
    for (const wrapper of moduleRef.controllers.values()) {
      if (wrapper.metatype) types.set(wrapper.metatype.name, wrapper.metatype as Function);
    }
  }
  return types;
}

/** Every route the application serves, with the zod schemas of its body and query. */
export function listRoutesWithSchemas(app: INestApplication): WriteRoute[] {
  const types = controllerTypes(app);
  return listRoutes(app).map((route) => {
    const type = types.get(route.controller);
    const args = (type ? Reflect.getMetadata(ROUTE_ARGS_METADATA, type, route.handler) : undefined) as Record<string, { pipes?: unknown[] }> | undefined;
    const schemaOf = (kind: RouteParamtypes): z.ZodType | null => {
      for (const [key, arg] of Object.entries(args ?? {})) {
        if (Number(key.split(':')[0]) !== kind) continue;
        const pipe = arg.pipes?.find((p): p is ZodPipe<z.ZodType> => p instanceof ZodPipe);
        if (pipe) return (pipe as unknown as { schema: z.ZodType }).schema;
      }
      return null;
    };
    return { ...route, bodySchema: schemaOf(RouteParamtypes.BODY), querySchema: schemaOf(RouteParamtypes.QUERY) };
  });
}

/** Every route that changes something, read from the application itself, with the schema of its body. */
export function listWriteRoutes(app: INestApplication): WriteRoute[] {
  return listRoutesWithSchemas(app).filter((r) => WRITE_METHODS.has(r.method));
}
