import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { LotViewEntity } from './entities/lot-view.entity';
import { LotViewsService } from './lot-views.service';

/** The read service of `lot_views`, with no other dependency, for any module to import. */
@Module({
  imports: [TypeOrmModule.forFeature([LotViewEntity])],
  providers: [LotViewsService],
  exports: [LotViewsService],
})
export class LotViewsModule {}
