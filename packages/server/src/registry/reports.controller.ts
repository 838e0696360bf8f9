import { Body, Controller, Param, ParseUUIDPipe, Query } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import { CloseReportDto, ReportDto, ReportQueryDto } from './dto/registry-tools.dto';
import { FiledReportResponse, ReportPage, ReportResponse } from './dto/registry-responses.dto';
import { ReportsService } from './reports.service';
import { Accepted, Action, RateLimitedPublic, Read } from '../common/route.decorators';

@ApiTags('public')
@Controller('public/lots')
export class PublicReportsController {
  constructor(private readonly reports: ReportsService) {}

  @RateLimitedPublic()
  @Accepted(':code/reports', 'Report a problem with a listed lot’s public page', FiledReportResponse)
  file(@Param('code') code: string, @Body() dto: ReportDto): Promise<FiledReportResponse> {
    return this.reports.file(code, dto);
  }
}

@ApiTags('registry')
@Roles('registrar')
@Controller('registry/reports')
export class ReportsController {
  constructor(private readonly reports: ReportsService) {}

  @Read(undefined, 'Reports from public pages, by status', ReportPage)
  list(@Query() q: ReportQueryDto): Promise<ReportPage> {
    return this.reports.list(q);
  }

  @Action(
    ':id/close',
    'Close a report with an answer (e-mailed to the reporter if they left an address)',
    ReportResponse,
  )
  close(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: CloseReportDto,
  ): Promise<ReportResponse> {
    return this.reports.close(me.id, id, dto.resolution);
  }
}
