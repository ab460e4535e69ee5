import { createBrowserRouter, Navigate, type RouteObject } from 'react-router';
import { AppShell } from './app-shell';
import { RedirectIfSignedIn, RequireSignedIn } from './guards';
import { RouteError } from './route-error';
import { paths } from '@/lib/paths';

export const routes: RouteObject[] = [
  {
    element: <AppShell />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./welcome-page').then((m) => ({ Component: m.WelcomePage })) },
      {
        element: <RedirectIfSignedIn />,
        children: [
          { path: paths.signIn, lazy: () => import('@/features/auth/components/sign-in-page').then((m) => ({ Component: m.SignInPage })) },
          { path: paths.register, lazy: () => import('@/features/auth/components/register-page').then((m) => ({ Component: m.RegisterPage })) },
          { path: paths.forgotPassword, lazy: () => import('@/features/auth/components/password-reset-pages').then((m) => ({ Component: m.ForgotPasswordPage })) },
        ],
      },
      { path: paths.resetPassword, lazy: () => import('@/features/auth/components/password-reset-pages').then((m) => ({ Component: m.ResetPasswordPage })) },
      { path: paths.invitation(), lazy: () => import('./invitation-route').then((m) => ({ Component: m.InvitationRoute })) },
      {
        element: <RequireSignedIn />,
        children: [
          { path: paths.guilds, lazy: () => import('@/features/guilds/components/guild-list-page').then((m) => ({ Component: m.GuildListPage })) },
          { path: paths.settings, lazy: () => import('@/features/auth/components/settings-page').then((m) => ({ Component: m.SettingsPage })) },
          { path: paths.planner, lazy: () => import('./planner-route').then((m) => ({ Component: m.PlannerRoute })) },
          {
            path: paths.guild(),
            lazy: () => import('./guild-layout').then((m) => ({ Component: m.GuildLayout })),
            children: [
              { index: true, lazy: () => import('@/features/guilds/components/guild-overview').then((m) => ({ Component: m.GuildOverview })) },
              { path: 'members', lazy: () => import('@/features/guilds/components/members-page').then((m) => ({ Component: m.MembersPage })) },
              { path: 'swaps/:swapId/intake', lazy: () => import('@/features/intake/components/intake-page').then((m) => ({ Component: m.IntakePage })) },
            ],
          },
        ],
      },
      { path: '*', element: <Navigate to={paths.home} replace /> },
    ],
  },
  // Label sheets print on their own, without the app's frame around them.
  {
    element: <RequireSignedIn />,
    errorElement: <RouteError />,
    children: [{ path: paths.swapLabels(), lazy: () => import('@/features/intake/components/labels-page').then((m) => ({ Component: m.LabelsPage })) }],
  },
];

export const createRouter = () => createBrowserRouter(routes);
