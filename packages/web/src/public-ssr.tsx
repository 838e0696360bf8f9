// Built for Node (`vite build --ssr`, Preact in place of React like the page's own build): the
// server renders a listed lot's public page from the data it sends with it, so the history
// paints before any script has run. The verdict is left to the browser.
import { renderToString } from 'preact-render-to-string';
import type { PublicLotResponse } from './features/public-lot/public-lot.api';
import { PublicLotApp } from './features/public-lot/PublicLotPage';

/**
 * The markup of the public page at `pathname` (`/l/{code}` or `/L/{code}/{H}`) for the lot's
 * public data `text` (the API's JSON answer), to go inside the page's root element.
 */
export function renderPublicLotPage(pathname: string, text: string): string {
  const data = JSON.parse(text) as PublicLotResponse;
  const page = <PublicLotApp pathname={pathname} data={data} prerender />;
  // The JSX is typed for React; this build compiles it to Preact's elements.
  return renderToString(page as unknown as Parameters<typeof renderToString>[0]);
}
