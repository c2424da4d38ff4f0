import { createBrowserRouter, Navigate, RouterProvider } from 'react-router-dom';
import { RouteError } from '../components/errors/route-error';
import { AppShell } from '../components/layouts/app-shell';
import { RequireSignIn } from '../components/layouts/require-sign-in';
import { paths } from '../config/paths';
import { AdminUsersPage } from './routes/admin-users';
import { BenchPage } from './routes/bench';
import { CampaignPage } from './routes/campaign';
import { ForgotPasswordPage } from './routes/forgot-password';
import { InvitationPage } from './routes/invitation';
import { NotFoundPage } from './routes/not-found';
import { OutboxPage } from './routes/outbox';
import { ProjectPage } from './routes/project';
import { ProjectsPage } from './routes/projects';
import { ResetPasswordPage } from './routes/reset-password';
import { SettingsPage } from './routes/settings';
import { SharedViewPage } from './routes/shared-view';
import { SignInPage } from './routes/sign-in';
import { ViewPage } from './routes/view';

const router = createBrowserRouter([
  {
    // every page below shows RouteError if it fails to render, instead of a blank tab
    errorElement: <RouteError />,
    children: [
      { path: paths.signIn, element: <SignInPage /> },
      { path: paths.forgotPassword, element: <ForgotPasswordPage /> },
      { path: paths.resetPassword, element: <ResetPasswordPage /> },
      // Outside the guard: an invitee may have no account yet.
      { path: paths.invitation(':token'), element: <InvitationPage /> },
      { path: paths.outbox, element: <OutboxPage /> },
      // Outside the guard: a share link opens one view without an account.
      { path: paths.shared(':token'), element: <SharedViewPage /> },
      {
        element: <RequireSignIn />,
        children: [
          {
            element: <AppShell />,
            children: [
              { index: true, element: <Navigate to={paths.projects} replace /> },
              { path: paths.projects, element: <ProjectsPage /> },
              { path: paths.project(':id'), element: <ProjectPage /> },
              { path: paths.campaign(':projectId', ':campaignId'), element: <CampaignPage /> },
              { path: paths.view(':id'), element: <ViewPage /> },
              { path: paths.bench, element: <BenchPage /> },
              { path: paths.settings, element: <SettingsPage /> },
              { path: paths.adminUsers, element: <AdminUsersPage /> },
              { path: '*', element: <NotFoundPage /> },
            ],
          },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
