import { Controller, Get, Res } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { FileAnswer } from '../common/route.decorators';
import type { Response } from 'express';
import { Public } from '../auth/auth.decorators';
import { VerifyPageService } from './verify-page.service';

/** File name of the downloaded page. */
export const VERIFY_PAGE_FILE = 'beadroll-verify.html';

@ApiTags('verify')
@Controller('verify')
export class VerifyPageController {
  constructor(private readonly pages: VerifyPageService) {}

  @Public()
  @Get()
  @ApiOperation({
    summary: 'The offline verifier: one HTML page that checks a lot history file on the device',
  })
  @FileAnswer('the page', 'text/html')
  show(@Res() res: Response): void {
    this.send(res, false);
  }

  @Public()
  @Get('download')
  @ApiOperation({ summary: 'The offline verifier page as a file to keep' })
  @FileAnswer('the page as a file to keep', 'text/html')
  download(@Res() res: Response): void {
    this.send(res, true);
  }

  private send(res: Response, attachment: boolean): void {
    const page = this.pages.get();
    res.setHeader('Content-Type', 'text/html; charset=utf-8');
    res.setHeader('Content-Security-Policy', page.policy);
    res.setHeader('Cache-Control', 'no-cache');
    if (attachment) res.setHeader('Content-Disposition', `attachment; filename="${VERIFY_PAGE_FILE}"`);
    res.send(page.html);
  }
}
