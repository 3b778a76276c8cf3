import { VISIT_STATE_LABELS, type VisitState } from '../../../../shared/domain/visit-states';
import { Badge } from './badge';

const TONE: Record<VisitState, 'tide' | 'spark' | 'ok' | 'danger' | 'muted'> = {
  planned: 'tide',
  'under-way': 'spark',
  logged: 'ok',
  reviewed: 'ok',
  missed: 'danger',
  cancelled: 'muted',
};

/** A visit's state in words (the colour only helps). */
export function VisitStateBadge({ state }: { state: VisitState }) {
  return <Badge tone={TONE[state]}>{VISIT_STATE_LABELS[state]}</Badge>;
}
