import { Controller, Get, Query, Res } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { Roles } from '../auth/auth.decorators';
import { ActionsQueryDto, ExportQueryDto } from './dto/registry-tools.dto';
import { RegistrarActionPage } from './dto/registry-responses.dto';
import { RegistrarRecordService } from './registrar-record.service';
import { FileAnswer, Read } from '../common/route.decorators';

@ApiTags('registry')
@Roles('registrar')
@Controller('registry/actions')
export class RegistrarRecordController {
  constructor(private readonly record: RegistrarRecordService) {}

  @Read(undefined, 'The registrar’s record of decisions, newest first', RegistrarActionPage)
  list(@Query() q: ActionsQueryDto): Promise<RegistrarActionPage> {
    return this.record.list(q);
  }

  @Get('export')
  @ApiOperation({ summary: 'The whole record as a file, oldest first (JSON or CSV)' })
  @FileAnswer('the record as a file to keep', 'application/json', 'text/csv')
  async export(@Query() q: ExportQueryDto, @Res() res: Response): Promise<void> {
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Content-Disposition', `attachment; filename="registrar-record.${q.format}"`);
    if (q.format === 'csv') {
      const file = await this.record.csv();
      res.type(file.type).send(file.body);
    } else {
      res
        .type('application/json; charset=utf-8')
        .send(JSON.stringify({ actions: await this.record.all() }, null, 2));
    }
  }
}
