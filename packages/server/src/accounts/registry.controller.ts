import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Res,
  StreamableFile,
} from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import { ApplicantResponse, ReasonDto, RegistryQueryDto, RegistryPage } from './dto/registry.dto';
import { RegistryService } from './registry.service';

@ApiTags('registry')
@Roles('registrar')
@Controller('registry/accounts')
export class RegistryController {
  constructor(private readonly registry: RegistryService) {}

  @Get()
  @ApiOperation({
    summary: 'Dealer and assessor accounts by status (the pending ones are the verification queue)',
  })
  @ApiOkResponse({ type: RegistryPage })
  list(@Query() q: RegistryQueryDto): Promise<RegistryPage> {
    return this.registry.list(q);
  }

  @Get(':id/document')
  @ApiOperation({ summary: 'Download the document an applicant sent with their application' })
  @ApiProduces('application/pdf', 'image/jpeg', 'image/png')
  async document(
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const file = await this.registry.document(id);
    res.setHeader('Content-Type', file.type);
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="applicant-document.${file.type.split('/')[1]}"; filename*=UTF-8''${encodeURIComponent(file.name)}`,
    );
    return new StreamableFile(file.body, { length: file.size || undefined });
  }

  @Post(':id/approve')
  @HttpCode(200)
  @ApiOperation({ summary: 'Verify an applicant' })
  @ApiOkResponse({ type: ApplicantResponse })
  approve(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ApplicantResponse> {
    return this.registry.approve(id, me.id);
  }

  @Post(':id/reject')
  @HttpCode(200)
  @ApiOperation({ summary: 'Reject an applicant; the reason is e-mailed to them' })
  @ApiOkResponse({ type: ApplicantResponse })
  reject(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ReasonDto,
  ): Promise<ApplicantResponse> {
    return this.registry.reject(id, dto.reason, me.id);
  }

  @Post(':id/suspend')
  @HttpCode(200)
  @ApiOperation({ summary: 'Suspend a verified account; the reason is e-mailed to them' })
  @ApiOkResponse({ type: ApplicantResponse })
  suspend(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ReasonDto,
  ): Promise<ApplicantResponse> {
    return this.registry.suspend(id, dto.reason, me.id);
  }

  @Post(':id/reinstate')
  @HttpCode(200)
  @ApiOperation({ summary: 'Lift a suspension' })
  @ApiOkResponse({ type: ApplicantResponse })
  reinstate(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ApplicantResponse> {
    return this.registry.reinstate(id, me.id);
  }
}
