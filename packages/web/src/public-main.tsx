// The public lot page's module script. The lot was checked and its verdict shown by the page's
// first script (src/public-tick.ts), which the build writes into the HTML itself; this script
// brings the style sheets and loads the rest of the page (the tag box, photos, the log check,
// the report form), which takes the page over and takes core's verifier from that first script.
import '@fontsource/atkinson-hyperlegible/400.css';
import '@fontsource/atkinson-hyperlegible/700.css';
import './app/global.css';
import './features/public-lot/public-lot.css';
// The report form loads later, but its styles come with the page's: no second style sheet.
import './features/registry/report-problem.css';
import { FIRST_SCRIPT_RAN } from './first-script-event';

/** How long this script waits for the page's own copy of the first script before running its file. */
const FIRST_SCRIPT_WAIT_MS = 3000;

/**
 * Runs the first script when the page came without it: on the development server, or when the
 * page's copy of it did not run (a page saved or served elsewhere without its script hash).
 * The page's copy is an async module, which the browser may run just after this script: while
 * it is in the page and has not run, this waits for it (a page whose policy refuses it waits
 * FIRST_SCRIPT_WAIT_MS), so the same script is not fetched and run twice.
 */
async function firstScript(): Promise<void> {
  if (window.beadrollPage) return;
  if (document.querySelector('script[data-first-check]:not([src])')) {
    await new Promise<void>((ran) => {
      const timer = setTimeout(ran, FIRST_SCRIPT_WAIT_MS);
      window.addEventListener(
        FIRST_SCRIPT_RAN,
        () => {
          clearTimeout(timer);
          ran();
        },
        { once: true },
      );
    });
    if (window.beadrollPage) return;
  }
  if (import.meta.env.DEV) await import('./public-tick');
  else await import(/* @vite-ignore */ import.meta.env.BEADROLL_FIRST_SCRIPT!);
}

void firstScript().then(() => {
  const data = window.beadrollPage?.data ?? null;
  // After the next frame, so the verdict is painted before the rest of the page is evaluated (on
  // a second visit its script is already here and would otherwise hold the paint up).
  requestAnimationFrame(() =>
    setTimeout(() => {
      void import('./public-app').then(({ mountPublicLotPage, registerLotWorker }) => {
        mountPublicLotPage(document.getElementById('root')!, window.location.pathname, data);
        // Keeps the page and the lots it opened for the next visit with no signal.
        registerLotWorker(window.location.pathname);
      });
    }, 0),
  );
});
