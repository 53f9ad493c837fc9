import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { AppErrorBoundary } from './components/errors/app-error-boundary';
import { registerServiceWorker } from './lib/register-service-worker';
import './styles/index.css';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

createRoot(container).render(
  <StrictMode>
    <AppErrorBoundary>
      <AppProvider>
        <AppRouter />
      </AppProvider>
    </AppErrorBoundary>
  </StrictMode>,
);

registerServiceWorker();
