import { Module } from '@nestjs/common';
import { MulterModule } from '@nestjs/platform-express';
import { TypeOrmModule } from '@nestjs/typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { BlockedDigestsModule } from '../registry/blocked-digests.module';
import { StorageModule } from '../storage/storage.module';
import { ExhibitEntity } from './entities/exhibit.entity';
import { ExhibitProcessor } from './exhibit-processor';
import { ExhibitRedactionProjector } from './exhibit-redaction.projector';
import {
  ExhibitsController,
  PublicExhibitsController,
  PublicInheritedExhibitsController,
} from './exhibits.controller';
import { ExhibitsService } from './exhibits.service';
import { multerOptions, UploadGuardInterceptor } from './upload';

/** Evidence files bound to a lot's roll: upload, processing, storage and serving. */
@Module({
  imports: [
    StorageModule,
    LedgerModule,
    LotsModule,
    BlockedDigestsModule,
    TypeOrmModule.forFeature([ExhibitEntity]),
    MulterModule.registerAsync({ inject: [APP_CONFIG], useFactory: (c: AppConfig) => multerOptions(c) }),
  ],
  controllers: [ExhibitsController, PublicExhibitsController, PublicInheritedExhibitsController],
  providers: [ExhibitsService, ExhibitProcessor, ExhibitRedactionProjector, UploadGuardInterceptor],
  exports: [ExhibitsService],
})
export class ExhibitsModule {}
