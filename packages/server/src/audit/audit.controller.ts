import { Controller, Get, Res } from '@nestjs/common';
import { ApiExtraModels, ApiOkResponse, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { Roles } from '../auth/auth.decorators';
import { AuditService } from './audit.service';
import { AUDIT_EVENT_SCHEMA, AUDIT_EVENTS } from './dto/audit-events.dto';

@ApiTags('audit')
@Controller('audit')
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get('ledger')
  @Roles('registrar')
  @ApiOperation({
    summary:
      'Full-ledger audit: streams one JSON object a line (start, progress, broken, done) while every roll is verified',
  })
  @ApiProduces('application/x-ndjson')
  @ApiExtraModels(...AUDIT_EVENTS)
  @ApiOkResponse({ description: 'one such event a line', schema: AUDIT_EVENT_SCHEMA })
  async run(@Res() res: Response): Promise<void> {
    res.setHeader('Content-Type', 'application/x-ndjson; charset=utf-8');
    res.setHeader('Cache-Control', 'no-store');
    for await (const event of this.audit.run()) res.write(`${JSON.stringify(event)}\n`);
    res.end();
  }
}
