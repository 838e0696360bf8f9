import { Global, Module } from '@nestjs/common';
import { StandbyService } from './standby.service';

/** Public reads from the database's hot standby, when there is one. */
@Global()
@Module({ providers: [StandbyService], exports: [StandbyService] })
export class StandbyModule {}
