import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/App';
import { sendPendingWrites } from './lib/api';
import { startOutbox } from './lib/outbox';
import { registerAppWorker } from './lib/register-app-worker';
import './app/global.css';

// Writes an earlier page sent but never saw answered go again (same keys: done at most once).
void sendPendingWrites();
// Writes made with no signal (kept in IndexedDB) go when the signal returns, in order.
startOutbox();
registerAppWorker();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
