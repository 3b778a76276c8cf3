import { AppShell } from '../../components/layout/app-shell';
import { ServerStatus } from '../../features/health/components/server-status';
import { NAV_ITEMS } from '../nav';

export function RootLayout() {
  return <AppShell nav={NAV_ITEMS} status={<ServerStatus compact />} />;
}
