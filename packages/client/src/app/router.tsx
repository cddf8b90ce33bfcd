import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { PageSpinner } from '../components/ui/spinner';
import { meKey } from '../features/auth/api/get-me';
import { leaveSignedInArea } from '../features/auth/leave-signed-in-area';
import { RouteError } from '../routes/errors/route-error';
import { NotFoundPage } from '../routes/errors/not-found';
import { RootLayout } from '../routes/root-layout';
import { SignedInLayout } from '../routes/signed-in/signed-in-layout';
import { onSessionLost, queryClient } from './query-client';
import { requireMe } from './route-guards';

// The shell (layout, guards, errors) ships in the first load; each screen is fetched when first visited.
const routes: RouteObject[] = [
  {
    Component: RootLayout,
    errorElement: <RouteError standalone />,
    hydrateFallbackElement: <PageSpinner />,
    children: [
      {
        path: 'sign-in',
        lazy: async () => {
          const { loader, SignInPage } = await import('../routes/auth/sign-in');
          return { loader, Component: SignInPage };
        },
      },
      {
        path: 'forgot-password',
        lazy: async () => {
          const { loader, ForgotPasswordPage } = await import('../routes/auth/forgot-password');
          return { loader, Component: ForgotPasswordPage };
        },
      },
      {
        path: 'set-password',
        lazy: async () => ({ Component: (await import('../routes/auth/set-password')).SetPasswordPage }),
      },
      {
        id: 'signed-in',
        loader: requireMe,
        Component: SignedInLayout,
        children: [
          {
            // Errors below keep the top bar, so there is always a way back.
            errorElement: <RouteError />,
            children: [
              {
                index: true,
                lazy: async () => {
                  const { loader, CommonsPage } = await import('../routes/commons/commons');
                  return { loader, Component: CommonsPage };
                },
              },
              {
                path: 'farms/:farmId',
                lazy: async () => {
                  const { loader, FarmProfilePage } = await import('../routes/farms/farm-profile');
                  return { loader, Component: FarmProfilePage };
                },
              },
              {
                path: 'farms/:farmId/edit',
                lazy: async () => {
                  const { loader, FarmEditPage } = await import('../routes/farms/farm-edit');
                  return { loader, Component: FarmEditPage };
                },
              },
            ],
          },
        ],
      },
      { path: '*', Component: NotFoundPage },
    ],
  },
];

export const router = createBrowserRouter(routes);

onSessionLost(() => {
  // Only someone who was signed in can lose a session; a first visit signed out is the guard's job.
  if (!queryClient.getQueryData(meKey)) return;
  void leaveSignedInArea(queryClient, (to, options) => router.navigate(to, options), { notice: 'session-ended' });
});
