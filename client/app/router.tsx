import { createBrowserRouter, Navigate, Outlet } from 'react-router-dom';
import { GuestOnly, RequireRole } from './guards';
import { Layout } from './layout';
import { RouteError } from './routes/route-error';

/*
 * Every page is its own chunk, loaded when its address is first visited; the
 * layout, the guards and the error page stay in the entry (the error page must
 * render even when a page's chunk fails to load). `npm run bench:client`
 * reads the `import('./routes/…')` calls below to size each page's first load.
 *
 * Every path here is also listed in shared/page-paths.ts, which the server reads
 * to answer 404 for addresses without a page (tests/unit/page-paths.test.ts fails
 * until the two agree): add a page in both places.
 */
export const router = createBrowserRouter([
  {
    element: <Layout />,
    errorElement: <RouteError />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { path: '/', lazy: () => import('./routes/landing').then((m) => ({ Component: m.LandingRoute })) },
          { path: '/calculator', lazy: () => import('./routes/calculator').then((m) => ({ Component: m.CalculatorRoute })) },
          {
            element: <GuestOnly><Outlet /></GuestOnly>,
            children: [
              { path: '/signin', lazy: () => import('./routes/sign-in').then((m) => ({ Component: m.SignInRoute })) },
              { path: '/signup', lazy: () => import('./routes/sign-up').then((m) => ({ Component: m.SignUpRoute })) },
            ],
          },
          { path: '/forgot-password', lazy: () => import('./routes/forgot-password').then((m) => ({ Component: m.ForgotPasswordRoute })) },
          { path: '/reset-password', lazy: () => import('./routes/reset-password').then((m) => ({ Component: m.ResetPasswordRoute })) },
          { path: '/verify-email', lazy: () => import('./routes/verify-email').then((m) => ({ Component: m.VerifyEmailRoute })) },
          { path: '/confirm-new-email', lazy: () => import('./routes/confirm-new-email').then((m) => ({ Component: m.ConfirmNewEmailRoute })) },
          { path: '/help', lazy: () => import('./routes/help').then((m) => ({ Component: m.HelpRoute })) },
          { path: '/terms', lazy: () => import('./routes/terms').then((m) => ({ Component: m.TermsRoute })) },
          { path: '/privacy', lazy: () => import('./routes/privacy').then((m) => ({ Component: m.PrivacyRoute })) },
          { path: '/welcome/github', lazy: () => import('./routes/github-welcome').then((m) => ({ Component: m.GithubWelcomeRoute })) },
          {
            element: <RequireRole roles={['admin']}><Outlet /></RequireRole>,
            children: [
              { path: '/admin/people', lazy: () => import('./routes/admin-people').then((m) => ({ Component: m.AdminPeopleRoute })) },
              { path: '/admin/disputes', lazy: () => import('./routes/admin-disputes').then((m) => ({ Component: m.AdminDisputesRoute })) },
              { path: '/admin/disputes/:disputeId', lazy: () => import('./routes/admin-dispute-case').then((m) => ({ Component: m.AdminDisputeCaseRoute })) },
              { path: '/admin/shops', lazy: () => import('./routes/admin-shops').then((m) => ({ Component: m.AdminShopsRoute })) },
              { path: '/admin/ledger', lazy: () => import('./routes/admin-ledger').then((m) => ({ Component: m.AdminLedgerRoute })) },
              { path: '/admin/settings', lazy: () => import('./routes/admin-settings').then((m) => ({ Component: m.AdminSettingsRoute })) },
              { path: '/admin/audit', lazy: () => import('./routes/admin-audit').then((m) => ({ Component: m.AdminAuditRoute })) },
            ],
          },
          { path: '/shops', lazy: () => import('./routes/shop-directory').then((m) => ({ Component: m.ShopDirectoryRoute })) },
          { path: '/shops/:shopId', lazy: () => import('./routes/shop-page').then((m) => ({ Component: m.ShopPageRoute })) },
          {
            element: <RequireRole roles={['builder']}><Outlet /></RequireRole>,
            children: [
              { path: '/jobs', lazy: () => import('./routes/my-jobs').then((m) => ({ Component: m.MyJobsRoute })) },
              { path: '/jobs/new', lazy: () => import('./routes/job-new').then((m) => ({ Component: m.NewJobRoute })) },
              { path: '/jobs/:jobId/edit', lazy: () => import('./routes/job-edit').then((m) => ({ Component: m.EditJobRoute })) },
            ],
          },
          {
            element: <RequireRole><Outlet /></RequireRole>,
            children: [
              { path: '/dashboard', lazy: () => import('./routes/dashboard').then((m) => ({ Component: m.DashboardRoute })) },
              { path: '/settings', lazy: () => import('./routes/settings').then((m) => ({ Component: m.SettingsRoute })) },
              // The settings page was called "account" before.
              { path: '/account', element: <Navigate to="/settings" replace /> },
              { path: '/notifications', lazy: () => import('./routes/notifications').then((m) => ({ Component: m.NotificationsRoute })) },
              {
                path: '/settings/notifications',
                lazy: () => import('./routes/settings-notifications').then((m) => ({ Component: m.NotificationSettingsRoute })),
              },
              { path: '/jobs/:jobId', lazy: () => import('./routes/job-detail').then((m) => ({ Component: m.JobDetailRoute })) },
              {
                path: '/jobs/:jobId/inspection/:version/certificate',
                lazy: () => import('./routes/inspection-certificate').then((m) => ({ Component: m.InspectionCertificateRoute })),
              },
            ],
          },
          {
            element: <RequireRole roles={['shop']}><Outlet /></RequireRole>,
            children: [
              { path: '/board', lazy: () => import('./routes/board').then((m) => ({ Component: m.BoardRoute })) },
              { path: '/bids', lazy: () => import('./routes/my-bids').then((m) => ({ Component: m.MyBidsRoute })) },
              { path: '/queue', lazy: () => import('./routes/work-queue').then((m) => ({ Component: m.WorkQueueRoute })) },
              { path: '/shop/profile', lazy: () => import('./routes/shop-profile').then((m) => ({ Component: m.ShopProfileRoute })) },
              { path: '/jobs/:jobId/inspection/new', lazy: () => import('./routes/inspection-entry').then((m) => ({ Component: m.InspectionEntryRoute })) },
            ],
          },
          {
            element: <RequireRole roles={['builder', 'shop']}><Outlet /></RequireRole>,
            children: [
              { path: '/messages', lazy: () => import('./routes/messages').then((m) => ({ Component: m.MessagesRoute })) },
              { path: '/money', lazy: () => import('./routes/money-history').then((m) => ({ Component: m.MoneyHistoryRoute })) },
            ],
          },
          { path: '*', lazy: () => import('./routes/not-found').then((m) => ({ Component: m.NotFoundRoute })) },
        ],
      },
    ],
  },
]);
