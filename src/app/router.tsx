import { createBrowserRouter, Navigate, RouterProvider } from 'react-router-dom';
import { AppShell } from '../components/layouts/app-shell';
import { RequireSignIn } from '../components/layouts/require-sign-in';
import { paths } from '../config/paths';
import { NotFoundPage } from './routes/not-found';
import { ProjectsPage } from './routes/projects';
import { SignInPage } from './routes/sign-in';

const router = createBrowserRouter([
  { path: paths.signIn, element: <SignInPage /> },
  {
    element: <RequireSignIn />,
    children: [
      {
        element: <AppShell />,
        children: [
          { index: true, element: <Navigate to={paths.projects} replace /> },
          { path: paths.projects, element: <ProjectsPage /> },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
