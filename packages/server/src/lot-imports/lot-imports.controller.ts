import {
  Body,
  Controller,
  Get,
  HttpCode,
  Post,
  Query,
  Res,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import {
  ApiConsumes,
  ApiCreatedResponse,
  ApiOkResponse,
  ApiOperation,
  ApiProduces,
  ApiTags,
} from '@nestjs/swagger';
import type { Response } from 'express';
import { CurrentAccount, Roles, RollWriter, type Principal } from '../auth/auth.decorators';
import { UploadGuardInterceptor } from '../exhibits/upload';
import {
  CheckResponse,
  ImportFormDto,
  ImportLineResponse,
  SheetResponse,
  TemplateQueryDto,
} from './dto/lot-import.dto';
import { LotImportsService, type SheetFile } from './lot-imports.service';
import { MAX_SHEET_BYTES } from './sheet-reader';
import { FileAnswer } from '../common/route.decorators';

// No storage given and no module-wide multer settings here: multer keeps the sheet in memory.
const SHEET_UPLOAD = FileInterceptor('file', {
  limits: { fileSize: MAX_SHEET_BYTES, files: 1, fields: 1, parts: 2, fieldSize: 4000 },
});

@ApiTags('lot imports')
@Controller('lot-imports')
@Roles('dealer')
export class LotImportsController {
  constructor(private readonly imports: LotImportsService) {}

  @Get('template')
  @ApiOperation({ summary: 'The spreadsheet template for importing lots (CSV or XLSX)' })
  @FileAnswer('the template', 'text/csv', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
  async template(@Query() q: TemplateQueryDto, @Res() res: Response): Promise<void> {
    const t = await this.imports.template(q.format);
    res.setHeader('Content-Type', t.type);
    res.setHeader('Content-Disposition', `attachment; filename="${t.name}"`);
    res.send(t.body);
  }

  @Post('sheets')
  @HttpCode(200)
  @UseInterceptors(UploadGuardInterceptor, SHEET_UPLOAD)
  @ApiConsumes('multipart/form-data')
  @ApiOperation({
    summary: 'Read a CSV or XLSX sheet: its headers, a preview and the suggested column mapping',
  })
  @ApiOkResponse({ type: SheetResponse })
  sheet(@UploadedFile() file: SheetFile | undefined): Promise<SheetResponse> {
    return this.imports.sheet(file);
  }

  @Post('checks')
  @HttpCode(200)
  @UseInterceptors(UploadGuardInterceptor, SHEET_UPLOAD)
  @ApiConsumes('multipart/form-data')
  @ApiOperation({ summary: 'Dry run: every row’s problems as a registration; nothing is written' })
  @ApiOkResponse({ type: CheckResponse })
  check(@UploadedFile() file: SheetFile | undefined, @Body() form: ImportFormDto): Promise<CheckResponse> {
    return this.imports.check(file, form.mapping);
  }

  @Post()
  @RollWriter()
  @UseInterceptors(UploadGuardInterceptor, SHEET_UPLOAD)
  @ApiConsumes('multipart/form-data')
  @ApiProduces('application/x-ndjson')
  @ApiOperation({
    summary:
      'Register every row in one transaction (all or none, up to 500). Answers NDJSON lines: {"total"}, {"done"} as lots are written, then {"codes"} or {"error"}',
  })
  @ApiCreatedResponse({ type: ImportLineResponse, description: 'one such line at a time' })
  async run(
    @CurrentAccount() me: Principal,
    @UploadedFile() file: SheetFile | undefined,
    @Body() form: ImportFormDto,
    @Res() res: Response,
  ): Promise<void> {
    const line = (o: object) => res.write(`${JSON.stringify(o)}\n`);
    let started = false;
    try {
      const codes = await this.imports.run(
        me,
        file,
        form.mapping,
        (total) => {
          started = true;
          res.status(201).setHeader('Content-Type', 'application/x-ndjson; charset=utf-8');
          res.setHeader('Cache-Control', 'no-store');
          line({ total });
        },
        (done, total) => {
          if (done % 10 === 0 || done === total) line({ done, total });
        },
      );
      line({ codes });
      res.end();
    } catch (e) {
      // Before the first line the usual error answer applies; after it, the error is the last line.
      if (!started) throw e;
      const err = e as { code?: string; message?: string; fields?: unknown };
      line({
        error: {
          code: err.code ?? 'internal',
          message: err.message ?? 'The import failed; nothing was imported.',
          fields: err.fields,
        },
      });
      res.end();
    }
  }
}
