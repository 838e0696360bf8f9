import { Controller, Get, Header, Param, Req, Res } from '@nestjs/common';
import { ApiNotFoundResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { ACCESS_COOKIE } from '../auth/cookies';
import { Public } from '../auth/auth.decorators';
import { PublicBundle, PublicLotResponse } from './dto/public-lot.dto';
import { PublicLotsService, READ_FROM_HEADER } from './public-lots.service';

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
  async lot(
    @Param('code') code: string,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const signedIn = typeof req.cookies?.[ACCESS_COOKIE] === 'string';
    const { text, from } = await this.lots.lotRead(code, signedIn);
    res.setHeader(READ_FROM_HEADER, from);
    return text;
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
