import { Module } from '@nestjs/common';
import { LotsModule } from '../lots/lots.module';
import { LotImportsController } from './lot-imports.controller';
import { LotImportsService } from './lot-imports.service';
import { UploadGuardInterceptor } from '../exhibits/upload';

/** Importing lots from a CSV or XLSX spreadsheet. */
@Module({
  imports: [LotsModule],
  controllers: [LotImportsController],
  providers: [LotImportsService, UploadGuardInterceptor],
})
export class LotImportsModule {}
