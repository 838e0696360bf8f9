import { Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { AttributionAidDto } from './dto/aid-request.dto';
import { AidResponse } from './dto/aid-response.dto';
import { OpinionsService } from './opinions.service';

/** The attribution aid for other clients; the web runs the same core function in the browser. */
@ApiTags('opinions')
@Public()
@Controller('attribution-aid')
export class AttributionAidController {
  constructor(private readonly opinions: OpinionsService) {}

  @Post()
  @HttpCode(200)
  @ApiOperation({
    summary:
      'Ranked indications, plausibility warnings and cautions from clues and a draft (an aid, not an authentication)',
  })
  @ApiOkResponse({
    type: AidResponse,
    description: 'indications, warnings, cautions and the disclaimer, each rule with its sources',
  })
  aid(@Body() dto: AttributionAidDto): AidResponse {
    return this.opinions.aid(dto);
  }
}
