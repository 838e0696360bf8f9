import { Controller, Header, Param, Req, Res } from '@nestjs/common';
import { ApiNotFoundResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { Public } from '../auth/auth.decorators';
import { PublicBundle, PublicLotResponse } from './dto/public-lot.dto';
import { READ_FROM_HEADER, readsOwnWrites } from '../standby/read-from';
import { PublicLotsService } from './public-lots.service';
import { Read } from '../common/route.decorators';

@ApiTags('public')
@Public()
@Controller('public/lots')
export class PublicLotsController {
  constructor(private readonly lots: PublicLotsService) {}

  @Read(
    ':code',
    'A listed lot: its roll and ancestors as a bundle, and the dealer cards named on them',
    PublicLotResponse,
  )
  @ApiNotFoundResponse({ description: 'any code that is not a listed lot' })
  @Header('Content-Type', 'application/json; charset=utf-8')
  async lot(
    @Param('code') code: string,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const { answer, from } = await this.lots.lotRead(code, readsOwnWrites(req));
    res.setHeader(READ_FROM_HEADER, from);
    res.setHeader('ETag', answer.etag);
    return answer.text;
  }

  @Read(':code/bundle', 'The export bundle of a listed lot, as a file', PublicBundle)
  @ApiNotFoundResponse({ description: 'any code that is not a listed lot' })
  async bundle(
    @Param('code') text: string,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<PublicBundle> {
    const { code, bundle, from } = await this.lots.bundleRead(text, readsOwnWrites(req));
    res.setHeader(READ_FROM_HEADER, from);
    res.setHeader('Content-Disposition', `attachment; filename="${code}.beadroll.json"`);
    return bundle;
  }
}
