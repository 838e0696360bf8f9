import { Injectable } from '@nestjs/common';

/** The time source of roll entries (replaceable in tests). */
@Injectable()
export class LedgerClock {
  now(): Date {
    return new Date();
  }
}
