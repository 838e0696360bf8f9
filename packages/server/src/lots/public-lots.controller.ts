import { Controller, Get, Header, Param, Res } from '@nestjs/common';
import { ApiNotFoundResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { Public } from '../auth/auth.decorators';
import { PublicBundle, PublicLotResponse } from './dto/public-lot.dto';
import { PublicLotsService } from './public-lots.service';

@ApiTags('public')
@Public()
@Controller('public/lots')
export class PublicLotsController {
  constructor(private readonly lots: PublicLotsService) {}

  @Get(':code')
  @ApiOperation({
    summary: 'A listed lot: its roll and ancestors as a bundle, and the dealer cards named on them',
  })
  @ApiOkResponse({ type: PublicLotResponse })
  @ApiNotFoundResponse({ description: 'any code that is not a listed lot' })
  @Header('Content-Type', 'application/json; charset=utf-8')
  lot(@Param('code') code: string): Promise<string> {
    return this.lots.lotText(code);
  }

  @Get(':code/bundle')
  @ApiOperation({ summary: 'The export bundle of a listed lot, as a file' })
  @ApiOkResponse({ type: PublicBundle })
  @ApiNotFoundResponse({ description: 'any code that is not a listed lot' })
  async bundle(
    @Param('code') text: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<PublicBundle> {
    const code = await this.lots.listedCode(text);
    const bundle = await this.lots.bundle(code);
    res.setHeader('Content-Disposition', `attachment; filename="${code}.beadroll.json"`);
    return bundle;
  }
}
