import type * as PageShared from './features/public-lot/page-shared';
import type { PublicLotResponse } from './features/public-lot/public-lot.api';

declare global {
  interface Window {
    /** Left by the public page's first script (src/public-tick.ts). */
    beadrollPage?: { shared: typeof PageShared; data: PublicLotResponse | null };
  }
}

declare global {
  interface ImportMetaEnv {
    /** In the built public page: the address of the first script's own file (build/first-script.ts). */
    readonly BEADROLL_FIRST_SCRIPT?: string;
  }
}
