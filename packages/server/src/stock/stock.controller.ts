import { Controller, Get, Header, Query, Res, type StreamableFile } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { CurrentAccount, Roles, type Principal } from '../auth/auth.decorators';
import { attachment } from '../export/sheet-export';
import { StockExportQueryDto } from './dto/stock-requests.dto';
import { StockSummaryResponse } from './dto/stock-responses.dto';
import { StockService } from './stock.service';
import { SheetDownload } from '../common/route.decorators';

@ApiTags('stock')
@Controller('stock')
@Roles('dealer')
export class StockController {
  constructor(private readonly stock: StockService) {}

  @Get('summary')
  @Header('Cache-Control', 'no-store')
  @ApiOperation({
    summary: 'The dealer’s own stock cost and sales, cost and margin by month and year, per currency',
  })
  @ApiOkResponse({ type: StockSummaryResponse })
  summary(@CurrentAccount() me: Principal): Promise<StockSummaryResponse> {
    return this.stock.summary(me);
  }

  @SheetDownload('The stock held as CSV or XLSX, with cost, storage place and attribution on record')
  async export(
    @CurrentAccount() me: Principal,
    @Query() q: StockExportQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return attachment(res, await this.stock.export(me, q.format ?? 'csv'));
  }
}
