import { useState } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { AppProvider } from './provider';
import { routes } from './routes';

export function App() {
  const [router] = useState(() => createBrowserRouter(routes));
  return (
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  );
}
