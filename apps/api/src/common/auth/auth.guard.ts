import { type CanActivate, type ExecutionContext, Inject, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Request } from 'express';
import type { Role } from '@hitchbook/shared/roles';
import { AppError, forbidden, unauthenticated } from '../errors/app-error.js';
import { SessionService } from '../../modules/auth/session.service.js';
import type { RequestWithActor } from './actor.js';
import { bearerTokenOf } from './bearer.js';
import { ALLOWED_ROLES, IS_PUBLIC } from './decorators.js';

/**
 * Deny by default: a route runs only when it is marked @Public() or the caller's current role
 * (read from the database on every request, so removals and role changes bite at once) is listed in @Roles().
 */
@Injectable()
export class AuthGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    @Inject(SessionService) private readonly sessions: SessionService,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ALLOWED_ROLES, targets);

    const req = context.switchToHttp().getRequest<Request & RequestWithActor>();
    const token = bearerTokenOf(req);
    if (token === null) throw unauthenticated();
    // Read already for this request's token when it came by the kept answers (common/http/read-cache.ts).
    const actor = req.actor ?? (await this.sessions.actorFromAccessToken(token));
    if (!actor) throw new AppError('unauthenticated', 'Your session has ended; sign in again.');
    req.actor = actor;

    if (!roles || roles.length === 0) throw forbidden();
    if (!roles.includes(actor.role)) throw forbidden();
    return true;
  }
}
