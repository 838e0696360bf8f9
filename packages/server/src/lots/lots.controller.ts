import { Body, Controller, Get, Header, Param, Query, Res, type StreamableFile } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Bundle } from '@beadroll/core';
import type { Response } from 'express';
import { CurrentAccount, type Principal } from '../auth/auth.decorators';
import {
  CreateLotDto,
  DescribeLotDto,
  ExportLotsQueryDto,
  ListLotsQueryDto,
  ObserveLotDto,
  SetListingDto,
} from './dto/lot-requests.dto';
import { LotDetailResponse, LotListResponse, RollResponse, VerifyResponse } from './dto/lot-responses.dto';
import { PublicBundle } from './dto/public-lot.dto';
import { attachment } from '../export/sheet-export';
import { LotsService } from './lots.service';
import { DealerRollWrite, Read, SheetDownload } from '../common/route.decorators';

@ApiTags('lots')
@Controller('lots')
export class LotsController {
  constructor(private readonly lots: LotsService) {}

  @DealerRollWrite(
    'POST',
    undefined,
    'Register a lot (writes registered, and observed when observations are given)',
    LotDetailResponse,
  )
  register(@CurrentAccount() me: Principal, @Body() dto: CreateLotDto): Promise<LotDetailResponse> {
    return this.lots.register(me, dto);
  }

  @Read(
    undefined,
    'List the lots the signed-in account may read, with paging, sorting, filters and search',
    LotListResponse,
  )
  list(@CurrentAccount() me: Principal, @Query() q: ListLotsQueryDto): Promise<LotListResponse> {
    return this.lots.list(me, q);
  }

  @SheetDownload('The lot list as CSV or XLSX, with the list’s filters, search and sort')
  async export(
    @CurrentAccount() me: Principal,
    @Query() q: ExportLotsQueryDto,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    return attachment(res, await this.lots.exportList(me, q));
  }

  @Read(':code', 'A lot, derived from its roll, with the viewer’s own sealed details', LotDetailResponse)
  detail(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<LotDetailResponse> {
    return this.lots.detail(me, code);
  }

  @DealerRollWrite(
    'POST',
    ':code/descriptions',
    'Write a full new description (described)',
    LotDetailResponse,
  )
  describe(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: DescribeLotDto,
  ): Promise<LotDetailResponse> {
    return this.lots.describe(me, code, dto);
  }

  @DealerRollWrite('POST', ':code/observations', 'Record observations (observed)', LotDetailResponse)
  observe(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: ObserveLotDto,
  ): Promise<LotDetailResponse> {
    return this.lots.observe(me, code, dto);
  }

  @DealerRollWrite(
    'PUT',
    ':code/listing',
    'List or unlist the lot (written on the roll as described)',
    LotDetailResponse,
  )
  setListing(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: SetListingDto,
  ): Promise<LotDetailResponse> {
    return this.lots.setListing(me, code, dto.listed);
  }

  @Read(
    ':code/roll',
    'The roll as stored: exact headers and bodies, and the viewer’s own sealed values',
    RollResponse,
  )
  roll(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<RollResponse> {
    return this.lots.roll(me, code);
  }

  @Read(':code/verification', 'Verify the stored roll with the ledger’s verifier', VerifyResponse)
  verify(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<VerifyResponse> {
    return this.lots.verify(me, code);
  }

  @Get(':code/bundle')
  @ApiOperation({ summary: 'Export bundle (check it offline at /verify or with beadroll-verify)' })
  @ApiProduces('application/json')
  @ApiOkResponse({
    type: PublicBundle,
    description:
      'the bundle as a file: the rolls the viewer may read, as on the public page, no sealed value',
  })
  @Header('Cache-Control', 'no-store')
  async bundle(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<Bundle> {
    const bundle = await this.lots.bundle(me, code);
    res.setHeader('Content-Disposition', `attachment; filename="${bundle.rolls[0]!.lot}.beadroll.json"`);
    return bundle;
  }
}
