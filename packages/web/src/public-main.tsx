import '@fontsource/atkinson-hyperlegible/400.css';
import '@fontsource/atkinson-hyperlegible/700.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import './app/global.css';
import { PublicLotApp } from './features/public-lot/PublicLotPage';
import { registerLotWorker } from './lib/register-lot-worker';

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <PublicLotApp pathname={window.location.pathname} />
  </StrictMode>,
);

// Keeps the page and the lots it opened for the next visit with no signal.
registerLotWorker(window.location.pathname);
