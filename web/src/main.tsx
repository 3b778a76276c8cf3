import '@fontsource/noto-sans/400.css';
import '@fontsource/noto-sans/500.css';
import '@fontsource/noto-sans/700.css';
import './styles.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { registerSW } from 'virtual:pwa-register';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

// the service worker keeps the app shell for offline use at the cabinet; a new version takes
// over by itself (the readings in progress are drafts in IndexedDB and survive the reload)
if ('serviceWorker' in navigator) {
  const controlledAtLoad = Boolean(navigator.serviceWorker.controller);
  registerSW({
    // registered on the window's load event: the first screen's requests go before the precache
    immediate: false,
    // reload only when a new version replaced the one this page runs (its files must match);
    // the first install, begun on the page before sign-in, changes nothing on this screen
    onNeedReload: () => {
      if (controlledAtLoad) window.location.reload();
    },
  });
}

createRoot(root).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
