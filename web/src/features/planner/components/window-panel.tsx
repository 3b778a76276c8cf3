import type { ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { DetailList } from '../../../components/ui/detail-list';
import { Modal } from '../../../components/ui/modal';
import type { WindowEvent } from '../utils/calendar-events';
import { formatZonedRange } from '../utils/zoned-time';

/** A shutdown window's occurrence: when, where, and the ways to plan visits into it. */
export function WindowPanel({
  event,
  canPlan,
  onPlanVisit,
  onPlanWindow,
  onEditWindow,
  onClose,
}: {
  event: WindowEvent;
  canPlan: boolean;
  onPlanVisit: () => void;
  /** Absent while planning a whole window is not available. */
  onPlanWindow?: () => void;
  /** Absent while changing windows is not available. */
  onEditWindow?: () => void;
  onClose: () => void;
}): ReactNode {
  const { window, occurrence } = event;
  return (
    <Modal title={window.title} onClose={onClose}>
      <div className="space-y-4">
        <DetailList
          items={[
            { label: 'This occurrence', value: formatZonedRange(occurrence.startsAt, occurrence.endsAt, window.timeZone), wide: true },
            { label: 'Site · area', value: `${window.siteName} · ${window.areaName}`, wide: true },
            { label: 'Repeats', value: window.recurrence ? (window.recurrenceText ?? window.recurrence) : 'once', wide: true },
            { label: 'Notes', value: window.notes, wide: true },
          ]}
        />
        {canPlan ? (
          <div className="flex flex-wrap gap-2 border-t border-tide-100 pt-4">
            {onPlanWindow ? (
              <Button variant="primary" onClick={onPlanWindow}>
                Plan this window
              </Button>
            ) : null}
            <Button onClick={onPlanVisit}>Plan one visit in it</Button>
            {onEditWindow ? <Button onClick={onEditWindow}>Change or retire this window</Button> : null}
          </div>
        ) : null}
      </div>
    </Modal>
  );
}
