import { Module } from '@nestjs/common';
import { TagPdfService } from './tag-pdf.service';

@Module({ providers: [TagPdfService], exports: [TagPdfService] })
export class TagsModule {}
