import { Body, Controller, Get, HttpCode, Inject, Post, Req, Res, UseGuards } from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiBearerAuth,
  ApiCookieAuth,
  ApiNoContentResponse,
  ApiOperation,
  ApiTags,
  ApiTooManyRequestsResponse,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { MeResponse, SessionResponse } from '@gyre/shared';
import { Public } from '../common/decorators/public.decorator';
import { GyreException } from '../common/errors/gyre.exception';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { ApiResult } from '../openapi/api-responses';
import { AuthThrottlerGuard } from './auth-throttler.guard';
import { AuthService, IssuedSession } from './auth.service';
import type { AuthUser } from './auth-user';
import { ClientIp, CurrentUser, SignedInOnly } from './decorators';
import {
  AcceptInvitationDto,
  ChangePasswordDto,
  PasswordResetConfirmDto,
  PasswordResetRequestDto,
  SignInDto,
} from './dto/auth.dto';
import { REFRESH_TOKEN_LIFETIME_MS } from './refresh-tokens.service';

export const REFRESH_COOKIE = 'gyre_refresh';
const REFRESH_COOKIE_PATH = '/api/auth';

@ApiTags('auth')
@ApiTooManyRequestsResponse({
  description:
    'Too many requests to /api/auth from this address, or (sign-in) too many failed sign-ins; `Retry-After` gives the seconds to wait',
})
@UseGuards(AuthThrottlerGuard)
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  @Public()
  @Post('sign-in')
  @HttpCode(200)
  @ApiOperation({ summary: 'Sign in with e-mail and password; sets the refresh cookie' })
  @ApiResult('SessionResponse', { description: 'The access token and the user' })
  async signIn(
    @Body() body: SignInDto,
    @ClientIp() clientIp: string | null,
    @Res({ passthrough: true }) response: Response,
  ): Promise<SessionResponse> {
    try {
      return this.withCookie(response, await this.auth.signIn(body.email, body.password, clientIp));
    } catch (error) {
      setRetryAfter(response, error);
      throw error;
    }
  }

  @Public()
  @Post('refresh')
  @HttpCode(200)
  @ApiCookieAuth(REFRESH_COOKIE)
  @ApiOperation({ summary: 'A new access token for the refresh cookie, which is rotated' })
  @ApiResult('SessionResponse', { description: 'The access token and the user' })
  async refresh(
    @Req() request: Request,
    @ClientIp() clientIp: string | null,
    @Res({ passthrough: true }) response: Response,
  ): Promise<SessionResponse> {
    const secret = refreshCookieOf(request);
    try {
      return this.withCookie(response, await this.auth.refresh(secret, clientIp));
    } catch (error) {
      this.clearCookie(response);
      throw error;
    }
  }

  @Public()
  @Post('sign-out')
  @HttpCode(204)
  @ApiCookieAuth(REFRESH_COOKIE)
  @ApiOperation({ summary: 'Ends the session of the refresh cookie (server-side revocation)' })
  @ApiNoContentResponse()
  async signOut(
    @Req() request: Request,
    @ClientIp() clientIp: string | null,
    @Res({ passthrough: true }) response: Response,
  ): Promise<void> {
    await this.auth.signOut(refreshCookieOf(request), clientIp);
    this.clearCookie(response);
  }

  @SignedInOnly()
  @Get('me')
  @ApiBearerAuth()
  @ApiOperation({
    summary: 'The signed-in user, their study and site, and their packed CASL rules',
  })
  @ApiResult('MeResponse', {
    description: 'CASL rules in packRules form: unpack with abilityFromPackedRules',
  })
  me(@CurrentUser() user: AuthUser): Promise<MeResponse> {
    return this.auth.me(user);
  }

  @SignedInOnly()
  @Post('password')
  @HttpCode(204)
  @ApiBearerAuth()
  @ApiOperation({ summary: 'Change one’s own password; ends every session' })
  @ApiNoContentResponse()
  async changePassword(
    @CurrentUser() user: AuthUser,
    @Body() body: ChangePasswordDto,
    @ClientIp() clientIp: string | null,
    @Res({ passthrough: true }) response: Response,
  ): Promise<void> {
    await this.auth.changePassword(user, body.currentPassword, body.newPassword, clientIp);
    this.clearCookie(response);
  }

  @Public()
  @Post('password-reset')
  @HttpCode(202)
  @ApiOperation({ summary: 'E-mails a single-use reset link if the address has an account' })
  @ApiAcceptedResponse({ description: 'Same answer whether or not the account exists' })
  requestPasswordReset(
    @Body() body: PasswordResetRequestDto,
    @ClientIp() clientIp: string | null,
  ): Promise<void> {
    return this.auth.requestPasswordReset(body.email, clientIp);
  }

  @Public()
  @Post('password-reset/confirm')
  @HttpCode(204)
  @ApiOperation({ summary: 'Sets a new password with the e-mailed token' })
  @ApiNoContentResponse()
  confirmPasswordReset(
    @Body() body: PasswordResetConfirmDto,
    @ClientIp() clientIp: string | null,
  ): Promise<void> {
    return this.auth.confirmPasswordReset(body.token, body.newPassword, clientIp);
  }

  @Public()
  @Post('accept-invitation')
  @HttpCode(204)
  @ApiOperation({ summary: 'Activates an invited account with the e-mailed token' })
  @ApiNoContentResponse()
  acceptInvitation(
    @Body() body: AcceptInvitationDto,
    @ClientIp() clientIp: string | null,
  ): Promise<void> {
    return this.auth.acceptInvitation(body.token, body.password, body.name, clientIp);
  }

  private withCookie(response: Response, issued: IssuedSession): SessionResponse {
    response.cookie(REFRESH_COOKIE, issued.refresh.secret, {
      httpOnly: true,
      sameSite: 'strict',
      secure: this.config.publicUrl.startsWith('https://'),
      path: REFRESH_COOKIE_PATH,
      maxAge: REFRESH_TOKEN_LIFETIME_MS,
    });
    response.setHeader('Cache-Control', 'no-store');
    return issued.response;
  }

  private clearCookie(response: Response): void {
    response.clearCookie(REFRESH_COOKIE, {
      httpOnly: true,
      sameSite: 'strict',
      secure: this.config.publicUrl.startsWith('https://'),
      path: REFRESH_COOKIE_PATH,
    });
  }
}

/** A throttled sign-in says how long to wait in the standard header (RFC 9110 §10.2.3). */
function setRetryAfter(response: Response, error: unknown): void {
  const seconds = error instanceof GyreException ? error.details?.retryAfterS : undefined;
  if (typeof seconds === 'number') response.setHeader('Retry-After', String(seconds));
}

/** The refresh cookie as cookie-parser (app.factory.ts) read it; anything but a string is none. */
function refreshCookieOf(request: Request): string | null {
  const value: unknown = (request.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
  return typeof value === 'string' ? value : null;
}
