// The public lot page's first script, kept small: when the server sent the lot's data and its
// rendered history with the page, the history is checked here with core's verifier and the
// verdict shown at once; the rest of the page's script (the tag box, photos, the log check, the
// report form) loads after that and takes the page over.
import '@fontsource/atkinson-hyperlegible/400.css';
import '@fontsource/atkinson-hyperlegible/700.css';
import './app/global.css';
import './features/public-lot/public-lot.css';
// The report form loads later, but its styles come with the page's: no second style sheet.
import './features/registry/report-problem.css';
import { checkLot } from './features/public-lot/check-lot';
import { embeddedLot } from './features/public-lot/embedded';
import { writeHistoryLine } from './features/public-lot/history-words';
import { parsePublicPath } from './features/public-lot/route';
import { registerLotWorker } from './lib/register-lot-worker';

const route = parsePublicPath(window.location.pathname);
const data = route ? embeddedLot(route.code) : null;
const live = document.querySelector('#root .pl-status-live');
if (route && data && live) writeHistoryLine(live, checkLot(route.code, data.bundle));

// After the next frame, so the verdict is painted before the rest of the page is evaluated (on a
// second visit its script is already here and would otherwise hold the paint up).
requestAnimationFrame(() =>
  setTimeout(() => {
    void import('./public-app').then(({ mountPublicLotPage }) =>
      mountPublicLotPage(document.getElementById('root')!, window.location.pathname, data),
    );
  }, 0),
);

// Keeps the page and the lots it opened for the next visit with no signal.
registerLotWorker(window.location.pathname);
