import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, type ComponentType } from 'react';
import { createBrowserRouter, redirect, RouterProvider, type RouteObject } from 'react-router-dom';
import { Loading } from '../components/ui/spinner';
import { paths } from '../config/paths';
import { ensureMe } from '../features/auth/api/get-me';
import { outboxQueryOptions } from '../features/dev-mail/api/get-outbox';
import { bankLoader, homeLoader, membersLoader, redirectIfSignedIn, requireSignIn } from './loaders';
import { newAssayLoader, assayLoader } from './routes/banks/germination-loaders';
import { lotLoader, lotsLoader, speciesAndPlantsLoader } from './routes/banks/lot-loaders';
import { plannerLoader, remindersLoader } from './routes/banks/planner-loaders';
import { overviewLoader } from './routes/banks/overview-loaders';
import { NotFoundPage } from './routes/not-found';
import { RootLayout } from './routes/root';
import { RouteError } from './routes/route-error';
import { registerSignInNavigator } from './session';

/**
 * A page whose code loads when it is first opened, alongside its loader's data: the app's first
 * download stays small, and each screen brings its own libraries (table, charts, forms).
 */
function page<M extends Record<string, unknown>>(load: () => Promise<M>, name: keyof M & string) {
  return async () => ({ Component: (await load())[name] as ComponentType });
}

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
            {
              path: paths.signIn.path,
              loader: redirectIfSignedIn(queryClient),
              lazy: page(() => import('./routes/auth/sign-in'), 'SignInPage'),
            },
            {
              path: paths.signUp.path,
              loader: redirectIfSignedIn(queryClient),
              lazy: page(() => import('./routes/auth/sign-up'), 'SignUpPage'),
            },
            {
              path: paths.forgotPassword.path,
              lazy: page(() => import('./routes/auth/forgot-password'), 'ForgotPasswordPage'),
            },
            {
              path: paths.resetPassword.path,
              lazy: page(() => import('./routes/auth/reset-password'), 'ResetPasswordPage'),
            },
            {
              path: paths.verifyEmail.path,
              lazy: page(() => import('./routes/auth/verify-email'), 'VerifyEmailPage'),
            },
            {
              path: paths.acceptInvitation.path,
              loader: async () => {
                await ensureMe(queryClient);
                return null;
              },
              lazy: page(() => import('./routes/invitations/accept'), 'AcceptInvitationPage'),
            },
            {
              path: paths.devMail.path,
              // Start reading the mailbox while the page's code loads; errors show on the page.
              loader: () => {
                void queryClient.prefetchQuery(outboxQueryOptions());
                return null;
              },
              lazy: page(() => import('./routes/dev/mail'), 'DevMailPage'),
            },

            // Signed in only.
            {
              loader: requireSignIn(queryClient),
              children: [
                {
                  index: true,
                  loader: homeLoader(queryClient),
                  lazy: page(() => import('./routes/home'), 'HomePage'),
                },
                // Where an offer link lands.
                {
                  path: paths.offer.path,
                  lazy: page(() => import('./routes/offers/offer'), 'OfferPage'),
                },
                {
                  path: paths.newBank.path,
                  lazy: page(() => import('./routes/banks/new-bank'), 'NewBankPage'),
                },
                {
                  path: paths.bank.path,
                  loader: bankLoader(queryClient),
                  lazy: page(() => import('./routes/banks/bank-layout'), 'BankLayout'),
                  children: [
                    {
                      index: true,
                      loader: ({ params }) => redirect(paths.overview.getHref(params.bankId ?? '')),
                    },
                    {
                      path: paths.overview.path,
                      loader: overviewLoader(queryClient),
                      lazy: page(() => import('./routes/banks/overview'), 'OverviewPage'),
                    },
                    {
                      path: paths.lots.path,
                      loader: lotsLoader(queryClient),
                      lazy: page(() => import('./routes/banks/lots'), 'LotsPage'),
                    },
                    {
                      path: paths.newLot.path,
                      loader: speciesAndPlantsLoader(queryClient),
                      lazy: page(() => import('./routes/banks/new-lot'), 'NewLotPage'),
                    },
                    {
                      path: paths.importLots.path,
                      lazy: page(() => import('./routes/banks/import-lots'), 'ImportLotsPage'),
                    },
                    {
                      path: paths.lot.path,
                      loader: lotLoader(queryClient),
                      lazy: page(() => import('./routes/banks/lot'), 'LotPage'),
                    },
                    // The circle's list of seed on offer.
                    {
                      path: paths.offers.path,
                      lazy: page(() => import('./routes/banks/offers'), 'OffersPage'),
                    },
                    {
                      path: paths.plants.path,
                      loader: speciesAndPlantsLoader(queryClient),
                      lazy: page(() => import('./routes/banks/plants'), 'PlantsPage'),
                    },
                    {
                      path: paths.labels.path,
                      lazy: page(() => import('./routes/banks/labels'), 'LabelsPage'),
                    },
                    {
                      path: paths.newAssay.path,
                      loader: newAssayLoader(queryClient),
                      lazy: page(
                        () => import('./routes/banks/new-germination-assay'),
                        'NewGerminationAssayPage',
                      ),
                    },
                    {
                      path: paths.assay.path,
                      loader: assayLoader(queryClient),
                      lazy: page(() => import('./routes/banks/germination-assay'), 'GerminationAssayPage'),
                    },
                    {
                      path: paths.planner.path,
                      loader: plannerLoader(queryClient),
                      lazy: page(() => import('./routes/banks/planner'), 'PlannerPage'),
                    },
                    {
                      path: paths.reminders.path,
                      loader: remindersLoader(queryClient),
                      lazy: page(() => import('./routes/banks/reminders'), 'RemindersPage'),
                    },
                    {
                      path: paths.members.path,
                      loader: membersLoader(queryClient),
                      lazy: page(() => import('./routes/banks/members'), 'MembersPage'),
                    },
                    {
                      path: paths.settings.path,
                      lazy: page(() => import('./routes/banks/settings'), 'SettingsPage'),
                    },
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
