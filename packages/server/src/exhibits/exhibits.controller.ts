import { Body, Controller, Get, Param, Post, Req, Res, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBody, ApiConsumes, ApiOperation, ApiTags, ApiCreatedResponse } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { CurrentAccount, Public, type Principal, Roles, RollWriter } from '../auth/auth.decorators';
import { AddExhibitBodyDoc, AddExhibitDto } from './dto/add-exhibit.dto';
import { AddExhibitResponse, ExhibitListResponse } from './dto/exhibit-response.dto';
import { READ_FROM_HEADER, readsOwnWrites } from '../standby/read-from';
import { sendExhibitFile } from './exhibit-response';
import { ExhibitsService } from './exhibits.service';
import { IdempotencyInterceptor } from '../idempotency/idempotency.interceptor';
import { UploadGuardInterceptor, type UploadedExhibitFile } from './upload';
import { FileAnswer, Read } from '../common/route.decorators';
import { EXHIBIT_MEDIA_TYPES } from './exhibit-processor';

const EXHIBIT_FILE = 'the file’s bytes; its SHA-256 is the ETag (web and thumb are JPEG)';

@ApiTags('exhibits')
@Controller('lots/:code/exhibits')
export class ExhibitsController {
  constructor(private readonly exhibits: ExhibitsService) {}

  @Post()
  @Roles('dealer', 'assessor')
  @RollWriter()
  @ApiOperation({ summary: 'Add one evidence file to a lot as an exhibit-added entry' })
  @ApiConsumes('multipart/form-data')
  @ApiBody({ type: AddExhibitBodyDoc })
  @UseInterceptors(UploadGuardInterceptor, FileInterceptor('file'), IdempotencyInterceptor)
  @ApiCreatedResponse({ type: AddExhibitResponse })
  add(
    @CurrentAccount() account: Principal,
    @Param('code') code: string,
    @Body() dto: AddExhibitDto,
    @UploadedFile() file: UploadedExhibitFile | undefined,
  ): Promise<AddExhibitResponse> {
    return this.exhibits.add(account, code, dto, file);
  }

  @Read(
    undefined,
    'The exhibits of a lot the viewer may read (own sealed ones included)',
    ExhibitListResponse,
  )
  list(@CurrentAccount() account: Principal, @Param('code') code: string): Promise<ExhibitListResponse> {
    return this.exhibits.list(account, code);
  }

  @Get(':seq/:variant')
  @ApiOperation({
    summary: 'A file of an exhibit, for a viewer who may read the lot; sealed ones for their adder',
  })
  @FileAnswer(EXHIBIT_FILE, ...EXHIBIT_MEDIA_TYPES)
  async file(
    @CurrentAccount() account: Principal,
    @Param('code') code: string,
    @Param('seq') seq: string,
    @Param('variant') variant: string,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    sendExhibitFile(req, res, await this.exhibits.viewerFile(account, code, seq, variant), false);
  }
}

@ApiTags('public')
@Controller('public/lots/:code/exhibits')
export class PublicExhibitsController {
  constructor(private readonly exhibits: ExhibitsService) {}

  @Get(':seq/:variant')
  @Public()
  @ApiOperation({ summary: 'A file of a public exhibit of a listed lot (variant original, web or thumb)' })
  @FileAnswer(EXHIBIT_FILE, ...EXHIBIT_MEDIA_TYPES)
  async file(
    @Param('code') code: string,
    @Param('seq') seq: string,
    @Param('variant') variant: string,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    const served = await this.exhibits.publicFile(code, seq, variant, readsOwnWrites(req));
    res.setHeader(READ_FROM_HEADER, served.from!);
    sendExhibitFile(req, res, served, true);
  }
}

@ApiTags('public')
@Controller('public/lots/:code/inherited/:lot/exhibits')
export class PublicInheritedExhibitsController {
  constructor(private readonly exhibits: ExhibitsService) {}

  @Get(':seq/:variant')
  @Public()
  @ApiOperation({
    summary: 'A file of an exhibit recorded on an ancestor of a listed lot, as its public data carries it',
  })
  @FileAnswer(EXHIBIT_FILE, ...EXHIBIT_MEDIA_TYPES)
  async file(
    @Param('code') code: string,
    @Param('lot') lot: string,
    @Param('seq') seq: string,
    @Param('variant') variant: string,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    const served = await this.exhibits.inheritedFile(code, lot, seq, variant, readsOwnWrites(req));
    res.setHeader(READ_FROM_HEADER, served.from!);
    sendExhibitFile(req, res, served, true);
  }
}
