import { Body, Controller, Get, Param, ParseUUIDPipe, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import { ApplicantResponse, ReasonDto, RegistryQueryDto, RegistryPage } from './dto/registry.dto';
import { RegistryService } from './registry.service';
import { Action, FileAnswer, Read } from '../common/route.decorators';

@ApiTags('registry')
@Roles('registrar')
@Controller('registry/accounts')
export class RegistryController {
  constructor(private readonly registry: RegistryService) {}

  @Read(
    undefined,
    'Dealer and assessor accounts by status (the pending ones are the verification queue)',
    RegistryPage,
  )
  list(@Query() q: RegistryQueryDto): Promise<RegistryPage> {
    return this.registry.list(q);
  }

  @Get(':id/document')
  @ApiOperation({ summary: 'Download the document an applicant sent with their application' })
  @FileAnswer('the document as the applicant sent it', 'application/pdf', 'image/jpeg', 'image/png')
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

  @Action(':id/approve', 'Verify an applicant', ApplicantResponse)
  approve(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ApplicantResponse> {
    return this.registry.approve(id, me.id);
  }

  @Action(':id/reject', 'Reject an applicant; the reason is e-mailed to them', ApplicantResponse)
  reject(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ReasonDto,
  ): Promise<ApplicantResponse> {
    return this.registry.reject(id, dto.reason, me.id);
  }

  @Action(':id/suspend', 'Suspend a verified account; the reason is e-mailed to them', ApplicantResponse)
  suspend(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: ReasonDto,
  ): Promise<ApplicantResponse> {
    return this.registry.suspend(id, dto.reason, me.id);
  }

  @Action(':id/reinstate', 'Lift a suspension', ApplicantResponse)
  reinstate(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ApplicantResponse> {
    return this.registry.reinstate(id, me.id);
  }
}
