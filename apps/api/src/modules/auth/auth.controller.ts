import { Body, Controller, Get, HttpCode, Inject, Param, Post, Req, Res } from '@nestjs/common';
import type { Request, Response } from 'express';
import {
  acceptInvitationSchema,
  loginSchema,
  passwordChangeSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  type LoginResponse,
  type SessionUser,
} from '@hitchbook/shared/schemas/auth';
import { ROLES } from '@hitchbook/shared/roles';
import type { z } from 'zod';
import type { Actor } from '../../common/auth/actor.js';
import { CurrentActor, Public, Roles } from '../../common/auth/decorators.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { AuthService, type SignedIn } from './auth.service.js';
import { assertSameOriginRequest } from './csrf.js';
import { SessionService } from './session.service.js';
import { REFRESH_COOKIE, REFRESH_COOKIE_PATH } from './tokens.js';

@Controller('auth')
export class AuthController {
  constructor(
    @Inject(AuthService) private readonly auth: AuthService,
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  @Public()
  @Post('login')
  @HttpCode(200)
  async login(@Body(new ZodPipe(loginSchema)) body: z.infer<typeof loginSchema>, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<LoginResponse> {
    return this.withCookie(res, await this.auth.login(body.email, body.password, req.ip ?? 'unknown'));
  }

  @Public()
  @Post('refresh')
  @HttpCode(200)
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<LoginResponse> {
    assertSameOriginRequest(req, this.config.appUrl);
    try {
      return this.withCookie(res, await this.auth.refresh(this.refreshCookie(req)));
    } catch (err) {
      this.clearCookie(res);
      throw err;
    }
  }

  @Public()
  @Post('logout')
  @HttpCode(204)
  async logout(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    assertSameOriginRequest(req, this.config.appUrl);
    await this.auth.logout(this.refreshCookie(req));
    this.clearCookie(res);
  }

  @Roles(...ROLES)
  @Get('me')
  me(@CurrentActor() actor: Actor): SessionUser {
    return this.sessions.toSessionUser(actor);
  }

  @Roles(...ROLES)
  @Post('password')
  @HttpCode(204)
  async changePassword(@CurrentActor() actor: Actor, @Body(new ZodPipe(passwordChangeSchema)) body: z.infer<typeof passwordChangeSchema>): Promise<void> {
    await this.auth.changePassword(actor, body.currentPassword, body.newPassword);
  }

  @Public()
  @Post('password-reset/request')
  @HttpCode(202)
  async requestReset(@Body(new ZodPipe(passwordResetRequestSchema)) body: z.infer<typeof passwordResetRequestSchema>): Promise<{ message: string }> {
    await this.auth.requestPasswordReset(body.email);
    return { message: 'If that address has a Hitchbook sign-in, a reset link is on its way.' };
  }

  @Public()
  @Post('password-reset/confirm')
  @HttpCode(204)
  async confirmReset(@Body(new ZodPipe(passwordResetConfirmSchema)) body: z.infer<typeof passwordResetConfirmSchema>): Promise<void> {
    await this.auth.confirmPasswordReset(body.token, body.password);
  }

  @Public()
  @Get('invitations/:token')
  describeInvitation(@Param('token') token: string): Promise<{ email: string; role: string; operationName: string }> {
    return this.auth.describeInvitation(token);
  }

  @Public()
  @Post('invitations/accept')
  @HttpCode(200)
  async acceptInvitation(@Body(new ZodPipe(acceptInvitationSchema)) body: z.infer<typeof acceptInvitationSchema>, @Res({ passthrough: true }) res: Response): Promise<LoginResponse> {
    return this.withCookie(res, await this.auth.acceptInvitation(body.token, body.name, body.password));
  }

  private refreshCookie(req: Request): string | undefined {
    const value = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
    return typeof value === 'string' && value.length > 0 && value.length < 200 ? value : undefined;
  }

  private withCookie(res: Response, signedIn: SignedIn): LoginResponse {
    res.cookie(REFRESH_COOKIE, signedIn.session.refreshToken, {
      httpOnly: true,
      sameSite: 'strict',
      secure: this.config.appUrl.startsWith('https:'),
      path: REFRESH_COOKIE_PATH,
      expires: signedIn.session.refreshExpiresAt,
    });
    return signedIn.body;
  }

  private clearCookie(res: Response): void {
    res.clearCookie(REFRESH_COOKIE, { path: REFRESH_COOKIE_PATH, httpOnly: true, sameSite: 'strict', secure: this.config.appUrl.startsWith('https:') });
  }
}
