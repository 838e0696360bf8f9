import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { AuditService } from './audit.service';

@Module({ imports: [LedgerModule], providers: [AuditService], exports: [AuditService] })
export class AuditModule {}
