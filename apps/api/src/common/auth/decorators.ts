import { createParamDecorator, type ExecutionContext, SetMetadata } from '@nestjs/common';
import type { Role } from '@hitchbook/shared/roles';
import type { Actor, RequestWithActor } from './actor.js';

export const IS_PUBLIC = 'hitchbook:public';
export const ALLOWED_ROLES = 'hitchbook:roles';

/** Opens a route to anonymous callers; only sign-in, health and signed webhooks should carry it. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** The roles that may call a route; every route declares this or @Public(). */
export const Roles = (...roles: Role[]) => SetMetadata(ALLOWED_ROLES, roles);

export const CurrentActor = createParamDecorator((_data: unknown, ctx: ExecutionContext): Actor => {
  const actor = ctx.switchToHttp().getRequest<RequestWithActor>().actor;
  if (!actor) throw new Error('CurrentActor used on a route without an authenticated actor');
  return actor;
});
