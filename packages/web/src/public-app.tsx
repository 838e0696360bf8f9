import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import type { PublicLotResponse } from './features/public-lot/public-lot.api';
import { PublicLotApp } from './features/public-lot/PublicLotPage';

export { registerLotWorker } from './lib/register-lot-worker';

/**
 * Renders the public lot page into `root`, over the server's rendering when there is one.
 * `data`: the lot's public data the server sent with the page (the same object the first script
 * checked), or null to fetch it.
 */
export function mountPublicLotPage(
  root: HTMLElement,
  pathname: string,
  data: PublicLotResponse | null,
): void {
  createRoot(root).render(
    <StrictMode>
      <PublicLotApp pathname={pathname} data={data} />
    </StrictMode>,
  );
}
