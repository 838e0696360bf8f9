import '@fontsource/atkinson-hyperlegible/400.css';
import '@fontsource/atkinson-hyperlegible/700.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import './app/global.css';
import { PublicLotApp } from './features/public-lot/PublicLotPage';

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <PublicLotApp pathname={window.location.pathname} />
  </StrictMode>,
);
