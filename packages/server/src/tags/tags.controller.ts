import { Body, Controller, Get, Header, HttpCode, Param, Post, Res, StreamableFile } from '@nestjs/common';
import { ApiOperation, ApiTags, ApiOkResponse } from '@nestjs/swagger';
import type { Response } from 'express';
import { CurrentAccount, Roles, type Principal } from '../auth/auth.decorators';
import { ListLotsDto, PrintTagsDto } from './dto/print-tags.dto';
import { NoReplay } from '../idempotency/idempotency.interceptor';
import { TagListResponse, TagsService, TagLotResponse } from './tags.service';
import { TagLayoutsResponse } from './dto/tag-layouts.dto';
import { FileAnswer, RollAction } from '../common/route.decorators';

@ApiTags('tags')
@Controller('tags')
export class TagsController {
  constructor(private readonly tags: TagsService) {}

  @Get('layouts')
  @Roles('dealer')
  @ApiOperation({
    summary: 'Tag designs and sheets, and whether each design fits the public host’s QR symbol',
  })
  @ApiOkResponse({ type: TagLayoutsResponse })
  layouts(): TagLayoutsResponse {
    return this.tags.layouts();
  }

  @Get('lots/:code')
  @Roles('dealer')
  @ApiOperation({ summary: 'A scanned lot: held by the signed-in dealer or not, and its head' })
  @ApiOkResponse({ type: TagLotResponse })
  lot(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<TagLotResponse> {
    return this.tags.lot(me, code);
  }

  @Post('pdf')
  @NoReplay()
  @HttpCode(200)
  @Roles('dealer')
  @ApiOperation({
    summary: 'Tag PDF for lots the dealer holds, printed at each lot’s newest entry (writes nothing)',
  })
  @FileAnswer('the tags on A4 or Letter sheets', 'application/pdf')
  @Header('Cache-Control', 'no-store')
  async pdf(
    @CurrentAccount() me: Principal,
    @Body() dto: PrintTagsDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const { pdf, filename } = await this.tags.render(me, dto);
    res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(pdf, { type: 'application/pdf' });
  }

  @RollAction(
    'list',
    'List unlisted lots before printing their tags (writes described entries)',
    TagListResponse,
    'dealer',
  )
  list(@CurrentAccount() me: Principal, @Body() dto: ListLotsDto): Promise<TagListResponse> {
    return this.tags.list(me, dto.lots);
  }
}
