import { createBrowserRouter, Navigate, useParams, type RouteObject } from 'react-router';
import { AppShell } from './app-shell';
import { RedirectIfSignedIn, RequireGuildAdmin, RequireSignedIn } from './guards';
import { RouteError } from './route-error';
import { Loading } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';

/** The sew-day page with the sew day's chat composed in (features do not import each other). */
async function sewDayWithChat() {
  const [{ SewDayPage }, { ChatPanel }] = await Promise.all([
    import('@/features/sew-days/components/sew-day-page'),
    import('@/features/chat/components/chat-panel'),
  ]);
  return { Component: () => <SewDayPage renderChat={(roomId) => <ChatPanel roomId={roomId} title="Sew-day chat" />} /> };
}

/** The measuring view in the person's chosen units. */
async function photoMeasureInUnits() {
  const { PhotoMeasurePage } = await import('@/features/photo-measure/components/photo-measure-page');
  return { Component: () => <PhotoMeasurePage units={unitsFor(useMe().data, Number(useParams().guildId))} /> };
}

export const routes: RouteObject[] = [
  {
    element: <AppShell />,
    // Shown while the first page's code loads, so the frame appears at once and the router has a fallback.
    hydrateFallbackElement: <AppShell hydrating />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./welcome-page').then((m) => ({ Component: m.WelcomePage })) },
      {
        element: <RedirectIfSignedIn />,
        children: [
          {
            path: paths.signIn,
            lazy: () => import('@/features/auth/components/sign-in-page').then((m) => ({ Component: m.SignInPage })),
          },
          {
            path: paths.register,
            lazy: () => import('@/features/auth/components/register-page').then((m) => ({ Component: m.RegisterPage })),
          },
          {
            path: paths.forgotPassword,
            lazy: () =>
              import('@/features/auth/components/password-reset-pages').then((m) => ({ Component: m.ForgotPasswordPage })),
          },
        ],
      },
      {
        path: paths.confirmEmail,
        lazy: () => import('@/features/auth/components/confirm-email-page').then((m) => ({ Component: m.ConfirmEmailPage })),
      },
      {
        path: paths.resetPassword,
        lazy: () => import('@/features/auth/components/password-reset-pages').then((m) => ({ Component: m.ResetPasswordPage })),
      },
      { path: paths.invitation(), lazy: () => import('./invitation-route').then((m) => ({ Component: m.InvitationRoute })) },
      {
        path: paths.unsubscribe,
        lazy: () =>
          import('@/features/notifications/components/unsubscribe-page').then((m) => ({ Component: m.UnsubscribePage })),
      },
      {
        element: <RequireSignedIn />,
        children: [
          { path: paths.guilds, lazy: () => import('./home-route').then((m) => ({ Component: m.HomeRoute })) },
          {
            path: paths.settings,
            lazy: () => import('@/features/auth/components/settings-page').then((m) => ({ Component: m.SettingsPage })),
          },
          {
            path: paths.myPayments,
            lazy: () => import('@/features/payments/components/my-payments-page').then((m) => ({ Component: m.MyPaymentsPage })),
          },
          {
            path: paths.paymentReturn,
            lazy: () =>
              import('@/features/payments/components/payment-return-page').then((m) => ({ Component: m.PaymentReturnPage })),
          },
          {
            path: paths.mailPreferences,
            lazy: () =>
              import('@/features/notifications/components/mail-preferences-page').then((m) => ({
                Component: m.MailPreferencesPage,
              })),
          },
          { path: paths.planner, lazy: () => import('./planner-route').then((m) => ({ Component: m.PlannerRoute })) },
          {
            path: paths.guild(),
            lazy: () => import('./guild-layout').then((m) => ({ Component: m.GuildLayout })),
            children: [
              // Swaps are the guild's front page; the guild overview moved to "About".
              {
                index: true,
                lazy: () => import('@/features/swaps/components/swap-list-page').then((m) => ({ Component: m.SwapListPage })),
              },
              {
                path: 'about',
                lazy: () => import('@/features/guilds/components/guild-overview').then((m) => ({ Component: m.GuildOverview })),
              },
              {
                path: 'swaps/new',
                lazy: () =>
                  import('@/features/swaps/components/setup/swap-setup-page').then((m) => ({ Component: m.NewSwapPage })),
              },
              {
                path: 'swaps/:swapId',
                lazy: () => import('@/features/swaps/components/swap-layout').then((m) => ({ Component: m.SwapLayout })),
                children: [
                  {
                    index: true,
                    lazy: () =>
                      import('@/features/swaps/components/swap-overview-page').then((m) => ({ Component: m.SwapOverviewPage })),
                  },
                  {
                    path: 'roster',
                    lazy: () => import('@/features/swaps/components/roster-page').then((m) => ({ Component: m.RosterPage })),
                  },
                  {
                    path: 'return',
                    lazy: () =>
                      import('@/features/swaps/components/distribution-page').then((m) => ({ Component: m.DistributionPage })),
                  },
                  {
                    path: 'sheet',
                    lazy: () =>
                      import('@/features/swaps/components/swap-sheet-page').then((m) => ({ Component: m.SwapSheetPage })),
                  },
                  {
                    path: 'edit',
                    lazy: () =>
                      import('@/features/swaps/components/setup/swap-setup-page').then((m) => ({ Component: m.EditSwapPage })),
                  },
                  {
                    path: 'design',
                    lazy: () =>
                      import('@/features/design-wall/components/design-wall-page').then((m) => ({ Component: m.DesignWallPage })),
                  },
                  {
                    path: 'fees',
                    lazy: () =>
                      import('@/features/payments/components/swap-fees-page').then((m) => ({ Component: m.SwapFeesPage })),
                  },
                ],
              },
              {
                path: 'members',
                lazy: () => import('@/features/guilds/components/members-page').then((m) => ({ Component: m.MembersPage })),
              },
              {
                path: 'dues',
                lazy: () => import('@/features/payments/components/dues-page').then((m) => ({ Component: m.DuesPage })),
              },
              {
                element: <RequireGuildAdmin />,
                children: [
                  {
                    path: 'mail',
                    lazy: () =>
                      import('@/features/notifications/components/mail-log-page').then((m) => ({ Component: m.MailLogPage })),
                  },
                  {
                    path: 'payments',
                    lazy: () =>
                      import('@/features/payments/components/treasurer-page').then((m) => ({ Component: m.TreasurerPage })),
                  },
                ],
              },
              {
                path: 'sew-days',
                lazy: () => import('@/features/sew-days/components/sew-days-page').then((m) => ({ Component: m.SewDaysPage })),
              },
              {
                path: 'sew-days/new',
                lazy: () =>
                  import('@/features/sew-days/components/new-sew-day-page').then((m) => ({ Component: m.NewSewDayPage })),
              },
              { path: 'sew-days/:sewDayId', lazy: sewDayWithChat },
              {
                path: 'sew-days/:sewDayId/edit',
                lazy: () =>
                  import('@/features/sew-days/components/edit-sew-day-page').then((m) => ({ Component: m.EditSewDayPage })),
              },
              {
                path: 'swaps/:swapId/board',
                lazy: () =>
                  import('@/features/live-board/components/live-board-page').then((m) => ({ Component: m.LiveBoardPage })),
              },
              {
                path: 'swaps/:swapId/chat',
                lazy: () => import('@/features/chat/components/swap-chat-page').then((m) => ({ Component: m.SwapChatPage })),
              },
              {
                path: 'swaps/:swapId/intake',
                lazy: () => import('@/features/intake/components/intake-page').then((m) => ({ Component: m.IntakePage })),
              },
              { path: 'swaps/:swapId/blocks/:blockId/photos/:photoId/measure', lazy: photoMeasureInUnits },
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
    hydrateFallbackElement: <Loading />,
    errorElement: <RouteError />,
    children: [
      {
        path: paths.swapLabels(),
        lazy: () => import('@/features/intake/components/labels-page').then((m) => ({ Component: m.LabelsPage })),
      },
    ],
  },
];

export const createRouter = () => createBrowserRouter(routes);
