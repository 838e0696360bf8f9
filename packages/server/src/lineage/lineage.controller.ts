import { Body, Controller, Get, Param, Post } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CurrentAccount, Roles, RollWriter, type Principal } from '../auth/auth.decorators';
import { CombineLotsDto, SplitLotDto } from './dto/lineage-requests.dto';
import { AncestryResponse, CombineResponse, SplitResponse } from './dto/lineage-responses.dto';
import { LineageService } from './lineage.service';

@ApiTags('lineage')
@Controller()
export class LineageController {
  constructor(private readonly lineage: LineageService) {}

  @Post('lots/:code/splits')
  @Roles('dealer')
  @RollWriter()
  @ApiOperation({ summary: 'Divide a lot into new lots (split on the lot, registered on each new lot)' })
  @ApiOkResponse({ type: SplitResponse })
  split(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: SplitLotDto,
  ): Promise<SplitResponse> {
    return this.lineage.split(me, code, dto);
  }

  @Post('combinations')
  @Roles('dealer')
  @RollWriter()
  @ApiOperation({
    summary: 'Make a new lot from beads of several held lots (combined on each, registered on the new lot)',
  })
  @ApiOkResponse({ type: CombineResponse })
  combine(@CurrentAccount() me: Principal, @Body() dto: CombineLotsDto): Promise<CombineResponse> {
    return this.lineage.combine(me, dto);
  }

  @Get('lots/:code/ancestry')
  @ApiOperation({ summary: 'The lots this lot was made from and the lots made from it, as a graph' })
  @ApiOkResponse({ type: AncestryResponse })
  ancestry(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<AncestryResponse> {
    return this.lineage.ancestry(me, code);
  }
}
