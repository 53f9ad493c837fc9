import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import { createBrowserRouter, redirect, RouterProvider, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/ui/spinner';
import { paths } from '../config/paths';
import { ensureMe } from '../features/auth/api/get-me';
import { outboxQueryOptions } from '../features/dev-mail/api/get-outbox';
import { bankLoader, homeLoader, membersLoader, redirectIfSignedIn, requireSignIn } from './loaders';
import { AcceptInvitationPage } from './routes/invitations/accept';
import { ForgotPasswordPage } from './routes/auth/forgot-password';
import { ResetPasswordPage } from './routes/auth/reset-password';
import { SignInPage } from './routes/auth/sign-in';
import { SignUpPage } from './routes/auth/sign-up';
import { BankLayout } from './routes/banks/bank-layout';
import { newTestLoader, testLoader } from './routes/banks/germination-loaders';
import { ImportLotsPage } from './routes/banks/import-lots';
import { LotPage } from './routes/banks/lot';
import { lotLoader, lotsLoader, speciesAndPlantsLoader } from './routes/banks/lot-loaders';
import { LotsPage } from './routes/banks/lots';
import { MembersPage } from './routes/banks/members';
import { NewLotPage } from './routes/banks/new-lot';
import { PlantsPage } from './routes/banks/plants';
import { PlannerPage } from './routes/banks/planner';
import { plannerLoader, remindersLoader } from './routes/banks/planner-loaders';
import { RemindersPage } from './routes/banks/reminders';
import { NewBankPage } from './routes/banks/new-bank';
import { overviewLoader } from './routes/banks/overview-loaders';
import { OverviewPage } from './routes/banks/overview';
import { SettingsPage } from './routes/banks/settings';
import { HomePage } from './routes/home';
import { NotFoundPage } from './routes/not-found';
import { RootLayout } from './routes/root';
import { RouteError } from './routes/route-error';
import { registerSignInNavigator } from './session';

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
            // Open to everyone.
            { path: paths.signIn.path, loader: redirectIfSignedIn(queryClient), element: <SignInPage /> },
            { path: paths.signUp.path, loader: redirectIfSignedIn(queryClient), element: <SignUpPage /> },
            { path: paths.forgotPassword.path, element: <ForgotPasswordPage /> },
            { path: paths.resetPassword.path, element: <ResetPasswordPage /> },
            {
              path: paths.acceptInvitation.path,
              loader: async () => {
                await ensureMe(queryClient);
                return null;
              },
              element: <AcceptInvitationPage />,
            },
            {
              path: paths.devMail.path,
              // Start reading the mailbox while the page's code loads; errors show on the page.
              loader: () => {
                void queryClient.prefetchQuery(outboxQueryOptions());
                return null;
              },
              lazy: async () => ({ Component: (await import('./routes/dev/mail')).DevMailPage }),
            },

            // Signed in only.
            {
              loader: requireSignIn(queryClient),
              children: [
                { index: true, loader: homeLoader(queryClient), element: <HomePage /> },
                { path: paths.newBank.path, element: <NewBankPage /> },
                {
                  path: paths.bank.path,
                  loader: bankLoader(queryClient),
                  element: <BankLayout />,
                  children: [
                    { index: true, loader: ({ params }) => redirect(paths.overview.getHref(params.bankId ?? '')) },
                    { path: paths.overview.path, loader: overviewLoader(queryClient), element: <OverviewPage /> },
                    { path: paths.lots.path, loader: lotsLoader(queryClient), element: <LotsPage /> },
                    { path: paths.newLot.path, loader: speciesAndPlantsLoader(queryClient), element: <NewLotPage /> },
                    { path: paths.importLots.path, element: <ImportLotsPage /> },
                    { path: paths.lot.path, loader: lotLoader(queryClient), element: <LotPage /> },
                    { path: paths.plants.path, loader: speciesAndPlantsLoader(queryClient), element: <PlantsPage /> },
                    {
                      path: paths.labels.path,
                      lazy: async () => ({ Component: (await import('./routes/banks/labels')).LabelsPage }),
                    },
                    {
                      path: paths.newTest.path,
                      loader: newTestLoader(queryClient),
                      lazy: async () => ({
                        Component: (await import('./routes/banks/new-germination-test')).NewGerminationTestPage,
                      }),
                    },
                    {
                      path: paths.test.path,
                      loader: testLoader(queryClient),
                      // The chart library loads with the test page, not with the app.
                      lazy: async () => ({ Component: (await import('./routes/banks/germination-test')).GerminationTestPage }),
                    },
                    { path: paths.planner.path, loader: plannerLoader(queryClient), element: <PlannerPage /> },
                    { path: paths.reminders.path, loader: remindersLoader(queryClient), element: <RemindersPage /> },
                    { path: paths.members.path, loader: membersLoader(queryClient), element: <MembersPage /> },
                    { path: paths.settings.path, element: <SettingsPage /> },
                  ],
                },
              ],
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
  useEffect(
    () => registerSignInNavigator((href, state) => void router.navigate(href, { replace: true, state })),
    [router],
  );
  return <RouterProvider router={router} />;
}
