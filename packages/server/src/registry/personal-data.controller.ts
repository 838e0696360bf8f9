import { Body, Controller, Get, HttpCode, Inject, Post, Res } from '@nestjs/common';
import { ApiOperation, ApiTags, ApiOkResponse } from '@nestjs/swagger';
import type { Response } from 'express';
import { clearSessionCookies } from '../auth/cookies';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { MessageResponse } from '../auth/dto/tokens.dto';
import { CloseAccountDto } from './dto/registry-tools.dto';
import { NoReplay } from '../idempotency/idempotency.interceptor';
import { PersonalDataResponse } from './dto/personal-data.dto';
import { PersonalDataService } from './personal-data.service';

@ApiTags('account')
@Controller('account')
export class PersonalDataController {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly data: PersonalDataService,
  ) {}

  @Get('personal-data')
  @ApiOperation({ summary: 'Everything Beadroll holds about the signed-in account, as a JSON file' })
  @ApiOkResponse({ type: PersonalDataResponse })
  async export(
    @CurrentAccount() me: Principal,
    @Res({ passthrough: true }) res: Response,
  ): Promise<PersonalDataResponse> {
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Content-Disposition', `attachment; filename="beadroll-${me.handle}.json"`);
    return this.data.export(me.id);
  }

  @Post('close')
  @NoReplay()
  @HttpCode(200)
  @Roles('dealer', 'assessor')
  @ApiOperation({
    summary: 'Close the account: anonymised, sealed details deleted, entries kept under its id',
  })
  @ApiOkResponse({ type: MessageResponse })
  async close(
    @CurrentAccount() me: Principal,
    @Body() dto: CloseAccountDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<MessageResponse> {
    const out = await this.data.close(me.id, dto.password);
    clearSessionCookies(res, this.config);
    return out;
  }
}
