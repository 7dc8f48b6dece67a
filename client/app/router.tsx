import { createBrowserRouter, Outlet } from 'react-router-dom';
import { GuestOnly, RequireRole } from './guards';
import { Layout } from './layout';
import { AdminPeopleRoute } from './routes/admin-people';
import { DashboardRoute } from './routes/dashboard';
import { ForgotPasswordRoute } from './routes/forgot-password';
import { GithubWelcomeRoute } from './routes/github-welcome';
import { LandingRoute } from './routes/landing';
import { NotFoundRoute } from './routes/not-found';
import { ResetPasswordRoute } from './routes/reset-password';
import { RouteError } from './routes/route-error';
import { SignInRoute } from './routes/sign-in';
import { SignUpRoute } from './routes/sign-up';
import { VerifyEmailRoute } from './routes/verify-email';

export const router = createBrowserRouter([
  {
    element: <Layout />,
    errorElement: <RouteError />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { path: '/', element: <LandingRoute /> },
          { path: '/calculator', lazy: () => import('./routes/calculator').then((m) => ({ Component: m.CalculatorRoute })) },
          { path: '/signin', element: <GuestOnly><SignInRoute /></GuestOnly> },
          { path: '/signup', element: <GuestOnly><SignUpRoute /></GuestOnly> },
          { path: '/forgot-password', element: <ForgotPasswordRoute /> },
          { path: '/reset-password', element: <ResetPasswordRoute /> },
          { path: '/verify-email', element: <VerifyEmailRoute /> },
          { path: '/welcome/github', element: <GithubWelcomeRoute /> },
          { path: '/dashboard', element: <RequireRole><DashboardRoute /></RequireRole> },
          { path: '/admin/people', element: <RequireRole roles={['admin']}><AdminPeopleRoute /></RequireRole> },
          {
            element: <RequireRole roles={['admin']}><Outlet /></RequireRole>,
            children: [
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
          { path: '*', element: <NotFoundRoute /> },
        ],
      },
    ],
  },
]);
