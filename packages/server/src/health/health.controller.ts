import { Controller } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/auth.decorators';
import { Read } from '../common/route.decorators';
import { HealthResponse } from './dto/health-response.dto';
import { HealthService } from './health.service';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  @Public()
  @Read(undefined, 'Service and database status', HealthResponse)
  report(): Promise<HealthResponse> {
    return this.health.report();
  }
}
