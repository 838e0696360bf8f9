import { Body, Controller } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { CurrentAccount, type Principal } from '../auth/auth.decorators';
import { AuthService } from '../auth/auth.service';
import { MeResponse, toMeResponse } from '../auth/dto/session.response';
import { ChangePasswordDto, MessageResponse } from '../auth/dto/tokens.dto';
import { Action, Read } from '../common/route.decorators';

type SessionPrincipal = Principal & { sessionId?: string };

@ApiTags('account')
@Controller('account')
export class AccountController {
  constructor(private readonly auth: AuthService) {}

  @Read(undefined, 'The signed-in account', MeResponse)
  async me(@CurrentAccount() p: SessionPrincipal): Promise<MeResponse> {
    return toMeResponse(await this.auth.me(p.id));
  }

  @Action('password', 'Change the password (every other session ends)', MessageResponse)
  changePassword(
    @CurrentAccount() p: SessionPrincipal,
    @Body() dto: ChangePasswordDto,
  ): Promise<MessageResponse> {
    return this.auth.changePassword(p.id, p.sessionId, dto.currentPassword, dto.newPassword);
  }
}
