import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { authQueries } from '@client/features/auth';
import { AppProvider, queryClient } from './app/provider';
import { router } from './app/router';
import './styles.css';

// Who is signed in decides the header and the guards: ask now, while the page's own chunk is still loading.
void queryClient.prefetchQuery(authQueries.me());

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);
