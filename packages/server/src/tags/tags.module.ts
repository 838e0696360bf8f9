import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { TagPdfService } from './tag-pdf.service';
import { TagsController } from './tags.controller';
import { TagsService } from './tags.service';

/** Printed tags: layouts, PDFs, and the scanner's look-up of a lot. */
@Module({
  imports: [LedgerModule, LotsModule],
  controllers: [TagsController],
  providers: [TagPdfService, TagsService],
  exports: [TagPdfService],
})
export class TagsModule {}
