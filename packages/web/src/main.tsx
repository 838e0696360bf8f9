import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/App';
import { sendPendingWrites } from './lib/api';
import './app/global.css';

// Writes an earlier page sent but never saw answered go again (same keys: done at most once).
void sendPendingWrites();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
