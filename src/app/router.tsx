import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AuthenticatedLayout } from './routes/authenticated-layout';
import { HomeRedirect } from './routes/home-redirect';
import { NotFoundPage } from './routes/not-found';
import { RouteErrorPage } from './routes/route-error';
import { SignInPage } from './routes/sign-in';

// Pages behind sign-in. To add one: create src/app/routes/<name>.tsx exporting the page,
// add an entry here (lazy, so each page is its own chunk), then add its link to nav.ts.
// Admin pages wrap themselves in <RequireRole roles={['admin']}>.
const appRoutes: RouteObject[] = [
  { index: true, element: <HomeRedirect /> },
  { path: 'board', lazy: () => import('./routes/board').then((m) => ({ Component: m.BoardPage })) },
  { path: 'alerts', lazy: () => import('./routes/alerts').then((m) => ({ Component: m.AlertsPage })) },
  { path: 'units/:id', lazy: () => import('./routes/unit').then((m) => ({ Component: m.UnitPage })) },
  { path: 'admin/switch-sheet', lazy: () => import('./routes/admin/switch-sheet').then((m) => ({ Component: m.AdminSwitchSheetPage })) },
  { path: 'units', lazy: () => import('./routes/units').then((m) => ({ Component: m.UnitsPage })) },
  { path: 'history', lazy: () => import('./routes/history').then((m) => ({ Component: m.HistoryPage })) },
  { path: 'reports', lazy: () => import('./routes/reports').then((m) => ({ Component: m.ReportsPage })) },
  { path: 'drivers', lazy: () => import('./routes/drivers').then((m) => ({ Component: m.DriversPage })) },
  { path: 'drivers/:id', lazy: () => import('./routes/drivers-coaching').then((m) => ({ Component: m.DriverCoachingPage })) },
  { path: 'battery', lazy: () => import('./routes/battery').then((m) => ({ Component: m.BatteryPage })) },
  { path: 'admin/users', lazy: () => import('./routes/admin/users').then((m) => ({ Component: m.AdminUsersPage })) },
  { path: 'admin/units', lazy: () => import('./routes/admin/units').then((m) => ({ Component: m.AdminUnitsPage })) },
  { path: 'admin/gateways', lazy: () => import('./routes/admin/gateways').then((m) => ({ Component: m.AdminGatewaysPage })) },
  { path: 'admin/audit', lazy: () => import('./routes/admin/audit').then((m) => ({ Component: m.AdminAuditPage })) },
  { path: 'work-orders', lazy: () => import('./routes/work-orders').then((m) => ({ Component: m.WorkOrdersPage })) },
  { path: 'work-orders/:id', lazy: () => import('./routes/work-orders-detail').then((m) => ({ Component: m.WorkOrderDetailPage })) },
  { path: 'depots', lazy: () => import('./routes/roster-depots').then((m) => ({ Component: m.DepotsPage })) },
  { path: 'settings/mail', lazy: () => import('./routes/mail-settings').then((m) => ({ Component: m.MailSettingsPage })) },
  { path: 'admin/roster', lazy: () => import('./routes/roster').then((m) => ({ Component: m.AdminRosterPage })) },
  { path: 'admin/mailbox', lazy: () => import('./routes/mail-box').then((m) => ({ Component: m.AdminMailboxPage })) },
  { path: '*', Component: NotFoundPage },
];

export function createRouter() {
  return createBrowserRouter([
    { path: '/sign-in', Component: SignInPage, errorElement: <RouteErrorPage /> },
    // The driver's page at the switch: no sign-in, outside the app shell.
    { path: '/switch/:token', lazy: () => import('./routes/switch').then((m) => ({ Component: m.SwitchPage })), errorElement: <RouteErrorPage /> },
    { path: '/', Component: AuthenticatedLayout, errorElement: <RouteErrorPage />, children: appRoutes },
  ]);
}
