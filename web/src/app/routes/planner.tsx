import { useMe } from '../../features/auth/api/get-me';
import { PlannerScreen, type PlannerSlots } from '../../features/planner/components/planner-screen';
import { ShutdownWindowDialog } from '../../features/shutdown-windows/components/shutdown-window-form';

/**
 * The Planner composes the screens that plan: the calendar (features/planner) with the window
 * planning, the shutdown-window form and the technicians' week of their own features.
 */
const slots: PlannerSlots = {
  newWindow: ({ siteId, areaId, onClose }) => <ShutdownWindowDialog siteId={siteId} areaId={areaId} onClose={onClose} />,
};

export function Component() {
  const me = useMe();
  return <PlannerScreen roles={me.data?.roles ?? []} slots={slots} />;
}
