import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useMemo } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/ui/spinner';
import { paths, type BankArea } from '../config/paths';
import { outboxQueryOptions } from '../features/dev-mail/api/get-outbox';
import { ComingSoonPage } from './routes/coming-soon';
import { HomePage } from './routes/home';
import { NotFoundPage } from './routes/not-found';
import { RootLayout } from './routes/root';
import { RouteError } from './routes/route-error';

const bankAreas: BankArea[] = ['overview', 'lots', 'planner', 'members', 'settings'];

export function createAppRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      path: paths.home.path,
      element: <RootLayout />,
      // If the shell itself fails, show the error on its own page.
      errorElement: <RouteError fullPage />,
      hydrateFallbackElement: <Loading label="Starting Hilum" className="min-h-dvh" />,
      children: [
        {
          // A page's error shows inside the shell, so the navigation stays usable.
          errorElement: <RouteError />,
          children: [
            { index: true, element: <HomePage /> },
            ...bankAreas.map((area) => ({ path: paths[area].path, element: <ComingSoonPage area={area} /> })),
            {
              path: paths.devMail.path,
              // Start reading the mailbox while the page's code loads; errors show on the page.
              loader: () => {
                void queryClient.prefetchQuery(outboxQueryOptions());
                return null;
              },
              lazy: async () => ({ Component: (await import('./routes/dev/mail')).DevMailPage }),
            },
            { path: '*', element: <NotFoundPage /> },
          ],
        },
      ],
    },
  ];
}

export function AppRouter() {
  const queryClient = useQueryClient();
  const router = useMemo(() => createBrowserRouter(createAppRoutes(queryClient)), [queryClient]);
  return <RouterProvider router={router} />;
}
