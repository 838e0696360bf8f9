import { Body, Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiOperation, ApiTags, ApiOkResponse } from '@nestjs/swagger';
import { CurrentAccount, type Principal } from '../auth/auth.decorators';
import { AuthService } from '../auth/auth.service';
import { MeResponse, toMeResponse } from '../auth/dto/session.response';
import { ChangePasswordDto, MessageResponse } from '../auth/dto/tokens.dto';

type SessionPrincipal = Principal & { sessionId?: string };

@ApiTags('account')
@Controller('account')
export class AccountController {
  constructor(private readonly auth: AuthService) {}

  @Get()
  @ApiOperation({ summary: 'The signed-in account' })
  @ApiOkResponse({ type: MeResponse })
  async me(@CurrentAccount() p: SessionPrincipal): Promise<MeResponse> {
    return toMeResponse(await this.auth.me(p.id));
  }

  @Post('password')
  @HttpCode(200)
  @ApiOperation({ summary: 'Change the password (every other session ends)' })
  @ApiOkResponse({ type: MessageResponse })
  changePassword(
    @CurrentAccount() p: SessionPrincipal,
    @Body() dto: ChangePasswordDto,
  ): Promise<MessageResponse> {
    return this.auth.changePassword(p.id, p.sessionId, dto.currentPassword, dto.newPassword);
  }
}
