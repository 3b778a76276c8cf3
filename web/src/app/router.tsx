import { createBrowserRouter, Navigate, RouterProvider } from 'react-router';
import { RootLayout } from './routes/root-layout';
import { RouteError } from './routes/route-error';

/** Each screen loads on first visit (lazy), so the first paint stays small. */
const router = createBrowserRouter([
  {
    path: '/',
    element: <RootLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Navigate to="/fleet" replace /> },
      { path: 'fleet', lazy: () => import('./routes/fleet') },
      { path: 'register/*', lazy: () => import('./routes/register') },
      { path: 'planner', lazy: () => import('./routes/planner') },
      { path: 'my-visits', lazy: () => import('./routes/my-visits') },
      { path: 'alerts', lazy: () => import('./routes/alerts') },
      { path: 'people', lazy: () => import('./routes/people') },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
