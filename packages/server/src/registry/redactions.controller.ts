import { Body, Controller, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags, ApiCreatedResponse } from '@nestjs/swagger';
import { RedactionRequestResponse, RedactionResponse } from './dto/registry-responses.dto';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import {
  DecisionNoteDto,
  DeclineDto,
  RedactDto,
  RedactionRequestDto,
  RequestQueryDto,
} from './dto/registry-tools.dto';
import { RedactionsService } from './redactions.service';
import { Action, Read } from '../common/route.decorators';

@ApiTags('registry')
@Roles('registrar')
@Controller('registry')
export class RedactionsController {
  constructor(private readonly redactions: RedactionsService) {}

  @Action(
    'redactions',
    'Remove the body of an entry (a redacted entry goes on the roll; the digest stays)',
    RedactionResponse,
  )
  redact(@CurrentAccount() me: Principal, @Body() dto: RedactDto): Promise<RedactionResponse> {
    return this.redactions.redact(me.id, dto.lot, dto.seq, dto.reason, dto.note ?? null);
  }

  @Read('redaction-requests', 'Holders’ requests to remove their own entries', [RedactionRequestResponse])
  requests(@Query() q: RequestQueryDto): Promise<RedactionRequestResponse[]> {
    return this.redactions.listRequests(q.status);
  }

  @Action(
    'redaction-requests/:id/approve',
    'Grant a holder’s request: the entry is redacted at the holder’s request',
    RedactionResponse,
  )
  approve(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: DecisionNoteDto,
  ): Promise<RedactionResponse> {
    return this.redactions.approve(me.id, id, dto.note ?? null);
  }

  @Action(
    'redaction-requests/:id/decline',
    'Decline a holder’s request, saying why',
    RedactionRequestResponse,
  )
  decline(
    @CurrentAccount() me: Principal,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: DeclineDto,
  ): Promise<RedactionRequestResponse> {
    return this.redactions.decline(me.id, id, dto.reason);
  }
}

@ApiTags('lots')
@Controller('lots')
export class RedactionRequestsController {
  constructor(private readonly redactions: RedactionsService) {}

  @Post(':code/redaction-requests')
  @Roles('dealer')
  @ApiOperation({ summary: 'The holder asks the registrar to remove one of their own entries' })
  @ApiCreatedResponse({ type: RedactionRequestResponse })
  request(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: RedactionRequestDto,
  ): Promise<RedactionRequestResponse> {
    return this.redactions.request(me.id, code, dto.seq, dto.note);
  }
}
