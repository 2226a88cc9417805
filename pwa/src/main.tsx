import '@fontsource/manrope/latin-400.css';
import '@fontsource/manrope/latin-500.css';
import '@fontsource/manrope/latin-600.css';
import '@fontsource/manrope/latin-700.css';
import '@fontsource/manrope/latin-ext-400.css';
import '@fontsource/manrope/latin-ext-600.css';
import '@fontsource/manrope/greek-400.css';
import '@fontsource/manrope/greek-600.css';
import './index.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { AppProvider } from './app/provider.js';
import { AppRouter } from './app/router.js';
import { registerServiceWorker } from './lib/service-worker.js';
import { startSyncEngine } from './lib/sync-engine.js';

registerServiceWorker();
startSyncEngine();

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no element with id "root"');

createRoot(container).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
