// The public lot page's first script. The build writes it into the page itself (an inline
// module, allowed by its hash in the Content-Security-Policy), so the lot is checked as soon as
// the HTML has arrived, with no further request: see build/first-script.ts. It leaves what it
// used on `window.beadrollPage` for the rest of the page (src/public-main.tsx).
import { firstCheck } from './features/public-lot/first-check';
import * as shared from './features/public-lot/page-shared';
import { FIRST_SCRIPT_RAN } from './first-script-event';

// Re-exported only so the build can name what the rest of the page may take from `shared`.
export * from './features/public-lot/page-shared';

window.beadrollPage = { shared, data: firstCheck(window.location.pathname) };
window.dispatchEvent(new Event(FIRST_SCRIPT_RAN));
