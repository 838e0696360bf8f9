import {
  Body,
  Controller,
  HttpCode,
  Inject,
  Post,
  Req,
  Res,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import { SIGN_UP_UPLOAD, SignUpUploadInterceptor, type UploadedDocument } from './applicant-document';
import type { Request, Response } from 'express';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { CurrentAccount, type Principal, Public } from './auth.decorators';
import { AuthService } from './auth.service';
import { clearSessionCookies, REFRESH_COOKIE, setSessionCookies } from './cookies';
import { SignInDto } from './dto/sign-in.dto';
import { SignUpDto } from './dto/sign-up.dto';
import { ForgotPasswordDto, MessageResponse, ResetPasswordDto, TokenDto } from './dto/tokens.dto';
import { SessionResponse, SignedInResponse, toMeResponse } from './dto/session.response';
import { NoReplay } from '../idempotency/idempotency.interceptor';
import { SessionsService } from './sessions.service';
import { Accepted, Action, RateLimitedPublic, Read } from '../common/route.decorators';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly auth: AuthService,
    private readonly sessions: SessionsService,
  ) {}

  @Public()
  @Read('session', 'The signed-in account, or null', SessionResponse)
  async session(@CurrentAccount() principal?: Principal): Promise<SessionResponse> {
    return { account: principal ? toMeResponse(await this.auth.me(principal.id)) : null };
  }

  @RateLimitedPublic()
  @UseInterceptors(SignUpUploadInterceptor, FileInterceptor('document', SIGN_UP_UPLOAD))
  @ApiConsumes('application/json', 'multipart/form-data')
  @Accepted(
    'sign-up',
    'Apply for a dealer or assessor account (always answers "check your e-mail"); as a form, with an optional document (PDF, JPEG or PNG, at most 10 MB) for the registrar',
    MessageResponse,
  )
  signUp(@Body() dto: SignUpDto, @UploadedFile() document?: UploadedDocument): Promise<MessageResponse> {
    return this.auth.signUp(dto, document);
  }

  @RateLimitedPublic()
  @Action('verify-email', 'Confirm an e-mail address with the token from the e-mailed link', MessageResponse)
  verifyEmail(@Body() dto: TokenDto): Promise<MessageResponse> {
    return this.auth.verifyEmail(dto.token);
  }

  @RateLimitedPublic()
  @Accepted(
    'forgot-password',
    'E-mail a link to choose a new password (always answers "check your e-mail")',
    MessageResponse,
  )
  forgotPassword(@Body() dto: ForgotPasswordDto): Promise<MessageResponse> {
    return this.auth.forgotPassword(dto.email);
  }

  @RateLimitedPublic()
  @Action(
    'reset-password',
    'Set a new password with the token from the e-mailed link (ends every session)',
    MessageResponse,
  )
  resetPassword(@Body() dto: ResetPasswordDto): Promise<MessageResponse> {
    return this.auth.resetPassword(dto.token, dto.password);
  }

  @RateLimitedPublic()
  @NoReplay()
  @Action('sign-in', 'Sign in with e-mail and password (sets the session cookies)', SignedInResponse)
  async signIn(@Body() dto: SignInDto, @Res({ passthrough: true }) res: Response): Promise<SignedInResponse> {
    const { account, session } = await this.auth.signIn(dto.email, dto.password);
    setSessionCookies(res, this.config, session.access, session.refresh);
    return { account: toMeResponse(account) };
  }

  @Public()
  @NoReplay()
  @Action('session/refresh', 'Exchange the refresh cookie for new session cookies', SessionResponse)
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<SessionResponse> {
    const token: unknown = req.cookies?.[REFRESH_COOKIE];
    // No refresh cookie at all: nobody is signed in, which is an answer, not an error.
    if (token === undefined) return { account: null };
    try {
      const session = await this.sessions.refresh(typeof token === 'string' ? token : '');
      setSessionCookies(res, this.config, session.access, session.refresh);
      return { account: toMeResponse(await this.auth.me(session.accountId)) };
    } catch (err) {
      clearSessionCookies(res, this.config);
      throw err;
    }
  }

  @Public()
  @Post('session/sign-out')
  @NoReplay()
  @HttpCode(204)
  @ApiOperation({ summary: 'Sign out: ends this session and clears its cookies' })
  async signOut(
    @CurrentAccount() principal: (Principal & { sessionId?: string }) | undefined,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    await this.sessions.signOut(principal?.sessionId, req.cookies?.[REFRESH_COOKIE]);
    clearSessionCookies(res, this.config);
  }
}
