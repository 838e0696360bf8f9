import { Module } from '@nestjs/common';
import { VerifyPageController } from './verify-page.controller';
import { VerifyPageService } from './verify-page.service';

/** The offline verifier page at /verify. */
@Module({
  controllers: [VerifyPageController],
  providers: [VerifyPageService],
})
export class VerifyPageModule {}
