import { VISIT_PLANNERS } from '../../../../shared/constants/planning';
import { useMe } from '../../features/auth/api/get-me';
import { ShutdownWindowImportScreen } from '../../features/shutdown-windows/components/shutdown-window-import';

/** Importing shutdown windows from CSV (/planner/windows/import). */
export function Component() {
  const me = useMe();
  const roles = me.data?.roles ?? [];
  return <ShutdownWindowImportScreen canImport={roles.some((r) => VISIT_PLANNERS.includes(r))} csrfToken={me.data?.csrfToken ?? null} />;
}
