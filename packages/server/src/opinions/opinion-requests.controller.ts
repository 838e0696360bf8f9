import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CurrentAccount, Roles, type Principal } from '../auth/auth.decorators';
import {
  AssessorListResponse,
  AssessorSearchQueryDto,
  CreateOpinionRequestDto,
  ListOpinionRequestsQueryDto,
  OpinionRequestListResponse,
  OpinionRequestResponse,
} from './dto/opinion-request.dto';
import { OpinionRequestsService } from './opinion-requests.service';
import { DealerRollWrite } from '../common/route.decorators';

@ApiTags('opinions')
@Controller('opinion-requests')
export class OpinionRequestsController {
  constructor(private readonly requests: OpinionRequestsService) {}

  @DealerRollWrite(
    'POST',
    undefined,
    'Ask a named assessor, or any verified assessor, for an opinion on a lot you hold',
    OpinionRequestResponse,
  )
  create(
    @CurrentAccount() me: Principal,
    @Body() dto: CreateOpinionRequestDto,
  ): Promise<OpinionRequestResponse> {
    return this.requests.create(me, dto);
  }

  @Get()
  @Roles('dealer', 'assessor')
  @ApiOperation({ summary: 'Requests you sent (box=sent), or an assessor’s queue (box=received)' })
  @ApiOkResponse({ type: OpinionRequestListResponse })
  list(
    @CurrentAccount() me: Principal,
    @Query() q: ListOpinionRequestsQueryDto,
  ): Promise<OpinionRequestListResponse> {
    return this.requests.list(me, q);
  }

  @Get('assessors')
  @Roles('dealer')
  @ApiOperation({ summary: 'Verified assessors to ask, by name, handle or business' })
  @ApiOkResponse({ type: AssessorListResponse })
  assessors(@Query() q: AssessorSearchQueryDto): Promise<AssessorListResponse> {
    return this.requests.assessors(q.q);
  }

  @Post(':id/cancel')
  @HttpCode(200)
  @Roles('dealer')
  @ApiOperation({ summary: 'Cancel your open request: the assessor can no longer read the lot through it' })
  @ApiOkResponse({ type: OpinionRequestResponse })
  cancel(@CurrentAccount() me: Principal, @Param('id') id: string): Promise<OpinionRequestResponse> {
    return this.requests.cancel(me, id);
  }
}
