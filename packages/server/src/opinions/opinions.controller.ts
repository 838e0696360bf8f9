import { Body, Controller, Param } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { CurrentAccount, type Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { RecordOpinionDto, ReplyDto, WithdrawOpinionDto } from './dto/opinion-requests.dto';
import { LotOpinionsResponse, OpinionWriteResponse } from './dto/opinion-responses.dto';
import { OpinionsService } from './opinions.service';
import { DealerRollWrite, Read, RollAction, RollWrite } from '../common/route.decorators';

function seqOf(text: string): number {
  if (!/^\d{1,9}$/.test(text))
    throw AppError.validation([{ field: 'seq', reason: 'must be a whole number' }]);
  return Number(text);
}

@ApiTags('opinions')
@Controller('lots/:code/opinions')
export class OpinionsController {
  constructor(private readonly opinions: OpinionsService) {}

  @Read(
    undefined,
    'Standing opinions with the holder’s attribution and the dissents, from the verified roll',
    LotOpinionsResponse,
  )
  list(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<LotOpinionsResponse> {
    return this.opinions.list(me, code);
  }

  @RollWrite(
    undefined,
    'Record an attribution opinion (opinion): the holder, or anyone on a listed lot',
    OpinionWriteResponse,
    'dealer',
    'assessor',
  )
  record(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: RecordOpinionDto,
  ): Promise<OpinionWriteResponse> {
    return this.opinions.record(me, code, dto);
  }

  @RollAction(
    ':seq/withdrawal',
    'Withdraw one’s own opinion (opinion-withdrawn)',
    OpinionWriteResponse,
    'dealer',
    'assessor',
  )
  withdraw(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Param('seq') seq: string,
    @Body() dto: WithdrawOpinionDto,
  ): Promise<OpinionWriteResponse> {
    return this.opinions.withdraw(me, code, seqOf(seq), dto);
  }

  @DealerRollWrite(
    'POST',
    ':seq/replies',
    'The holder answers an opinion (a note referring to it)',
    OpinionWriteResponse,
  )
  reply(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Param('seq') seq: string,
    @Body() dto: ReplyDto,
  ): Promise<OpinionWriteResponse> {
    return this.opinions.reply(me, code, seqOf(seq), dto);
  }
}
