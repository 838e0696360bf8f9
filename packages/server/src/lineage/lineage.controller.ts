import { Body, Controller, Param } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { CurrentAccount, type Principal } from '../auth/auth.decorators';
import { CombineLotsDto, SplitLotDto } from './dto/lineage-requests.dto';
import { AncestryResponse, CombineResponse, SplitResponse } from './dto/lineage-responses.dto';
import { LineageService } from './lineage.service';
import { DealerRollWrite, Read } from '../common/route.decorators';

@ApiTags('lineage')
@Controller()
export class LineageController {
  constructor(private readonly lineage: LineageService) {}

  @DealerRollWrite(
    'POST',
    'lots/:code/splits',
    'Divide a lot into new lots (split on the lot, registered on each new lot)',
    SplitResponse,
  )
  split(
    @CurrentAccount() me: Principal,
    @Param('code') code: string,
    @Body() dto: SplitLotDto,
  ): Promise<SplitResponse> {
    return this.lineage.split(me, code, dto);
  }

  @DealerRollWrite(
    'POST',
    'combinations',
    'Make a new lot from beads of several held lots (combined on each, registered on the new lot)',
    CombineResponse,
  )
  combine(@CurrentAccount() me: Principal, @Body() dto: CombineLotsDto): Promise<CombineResponse> {
    return this.lineage.combine(me, dto);
  }

  @Read(
    'lots/:code/ancestry',
    'The lots this lot was made from and the lots made from it, as a graph',
    AncestryResponse,
  )
  ancestry(@CurrentAccount() me: Principal, @Param('code') code: string): Promise<AncestryResponse> {
    return this.lineage.ancestry(me, code);
  }
}
