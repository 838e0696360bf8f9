import { Body, Controller, Post } from '@nestjs/common';
import { ApiOperation, ApiTags, ApiCreatedResponse } from '@nestjs/swagger';
import { CurrentAccount, type Principal, Roles } from '../auth/auth.decorators';
import { RegisterWitnessDto } from './dto/log.dto';
import { WitnessListResponse, WitnessResponse, WitnessesService } from './witnesses.service';
import { CheckpointsService } from './checkpoints.service';
import { Read } from '../common/route.decorators';

/** The registrar's list of the log's witnesses. */
@ApiTags('registry')
@Roles('registrar')
@Controller('registry/witnesses')
export class WitnessesController {
  constructor(
    private readonly witnesses: WitnessesService,
    private readonly checkpoints: CheckpointsService,
  ) {}

  @Read(undefined, 'Witnesses of the log and when each last cosigned', WitnessListResponse)
  async list(): Promise<WitnessListResponse> {
    return { logKey: this.checkpoints.verifierKey(), items: await this.witnesses.list() };
  }

  @Post()
  @ApiOperation({ summary: 'Register a witness by its cosignature key' })
  @ApiCreatedResponse({ type: WitnessResponse })
  register(@CurrentAccount() me: Principal, @Body() dto: RegisterWitnessDto): Promise<WitnessResponse> {
    return this.witnesses.register(me.id, dto.key);
  }
}
