import { useMe } from '../../features/auth/api/get-me';
import { PlanWindowDialog } from '../../features/plan-window/components/plan-window-dialog';
import { PlannerScreen, type PlannerSlots } from '../../features/planner/components/planner-screen';
import { ShutdownWindowDialog } from '../../features/shutdown-windows/components/shutdown-window-form';
import { TechnicianLoadView } from '../../features/technician-load/components/technician-load-view';

/**
 * The Planner composes the screens that plan: the calendar (features/planner) with the window
 * planning, the shutdown-window form and the technicians' week of their own features.
 */
const slots: PlannerSlots = {
  newWindow: ({ siteId, areaId, onClose }) => <ShutdownWindowDialog siteId={siteId} areaId={areaId} onClose={onClose} />,
  editWindow: ({ window, onClose }) => <ShutdownWindowDialog window={window} onClose={onClose} />,
  planWindow: ({ windowId, occurrenceStartsAt, siteId, areaId, onConfirmed, onClose }) => (
    <PlanWindowDialog
      windowId={windowId}
      occurrenceStartsAt={occurrenceStartsAt}
      siteId={siteId}
      areaId={areaId}
      onConfirmed={onConfirmed}
      onClose={onClose}
    />
  ),
  technicianLoad: ({ weekOn, onWeekChange, siteId, timeZone, onVisitOpen }) => (
    <TechnicianLoadView weekOn={weekOn} onWeekChange={onWeekChange} siteId={siteId} timeZone={timeZone} onVisitOpen={onVisitOpen} />
  ),
};

export function Component() {
  const me = useMe();
  return <PlannerScreen roles={me.data?.roles ?? []} slots={slots} />;
}
