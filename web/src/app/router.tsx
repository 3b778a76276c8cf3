import { createBrowserRouter, RouterProvider } from 'react-router';
import { RootLayout } from './routes/root-layout';
import { RouteError } from './routes/route-error';

/** Each screen loads on first visit (lazy), so the first paint stays small. */
const router = createBrowserRouter([
  // outside the signed-in shell: the ends of sign-in and sign-out
  { path: '/signed-out', lazy: () => import('./routes/signed-out'), errorElement: <RouteError /> },
  { path: '/sign-in-problem', lazy: () => import('./routes/sign-in-problem'), errorElement: <RouteError /> },
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./routes/start') },
      { path: 'fleet', lazy: () => import('./routes/fleet') },
      { path: 'register/*', lazy: () => import('./routes/register') },
      { path: 'planner', lazy: () => import('./routes/planner') },
      { path: 'planner/due', lazy: () => import('./routes/planner-due') },
      { path: 'planner/windows/import', lazy: () => import('./routes/planner-window-import') },
      { path: 'my-visits/*', lazy: () => import('./routes/my-visits') },
      { path: 'review', lazy: () => import('./routes/review') },
      { path: 'runs/:runId', lazy: () => import('./routes/run') },
      { path: 'alerts', lazy: () => import('./routes/alerts') },
      { path: 'people', lazy: () => import('./routes/people') },
      { path: 'profile', lazy: () => import('./routes/profile') },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
