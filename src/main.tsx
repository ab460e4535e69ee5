import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { Providers } from './app/providers';
import { createRouter } from './app/router';
import './styles.css';
import { registerServiceWorker } from './features/intake/offline/register-service-worker';

const router = createRouter();
registerServiceWorker();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <Providers>
      <RouterProvider router={router} />
    </Providers>
  </StrictMode>,
);
