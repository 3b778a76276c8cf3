import { HEALTH_LABELS } from '../../../../../shared/constants/health';
import {
  BANK_STATUS_LABELS,
  BASELINE_SOURCE_LABELS,
  CABINET_STATUS_LABELS,
  type BankStatus,
  type BaselineSource,
  type CabinetStatus,
  type Criticality,
} from '../../../../../shared/constants/register';
import type { BankLatestVerdict } from '../../../../../shared/schemas/bank';
import { Badge } from '../../../components/ui/badge';
import { formatRatio } from '../../../lib/units';

export function CabinetStatusBadge({ status }: { status: CabinetStatus }) {
  return <Badge tone={status === 'in-service' ? 'ok' : status === 'retired' ? 'muted' : 'warn'}>{CABINET_STATUS_LABELS[status]}</Badge>;
}

export function BankStatusBadge({ status }: { status: BankStatus }) {
  return <Badge tone={status === 'in-service' ? 'ok' : 'muted'}>{BANK_STATUS_LABELS[status]}</Badge>;
}

export function CriticalityBadge({ criticality }: { criticality: Criticality }) {
  const tone = criticality === 'critical' ? 'danger' : criticality === 'high' ? 'warn' : criticality === 'medium' ? 'tide' : 'muted';
  return <Badge tone={tone}>{criticality}</Badge>;
}

export function BaselineSourceBadge({ source }: { source: BaselineSource }) {
  return <Badge tone={source === 'decay-run' ? 'ok' : source === 'manual' ? 'spark' : 'muted'}>{BASELINE_SOURCE_LABELS[source]}</Badge>;
}

/** τ that stays a small tau inside upper-case labels (a capital Τ reads as T). */
export function Tau() {
  return <span className="normal-case">τ</span>;
}

/** The latest verdict of a bank, or a dash until its first decay run is judged. */
export function LatestVerdict({ verdict }: { verdict: BankLatestVerdict | null }) {
  if (!verdict) {
    return (
      <span className="text-tide-400" title="No decay runs yet: verdicts come with visits">
        —
      </span>
    );
  }
  const tone = verdict.health === 'healthy' ? 'ok' : verdict.health === 'watch' ? 'warn' : 'danger';
  return (
    <Badge tone={tone}>
      {HEALTH_LABELS[verdict.health]} · {formatRatio(verdict.capacitanceRatio)}
    </Badge>
  );
}
