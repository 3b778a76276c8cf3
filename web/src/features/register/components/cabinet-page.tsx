import type { ReactNode } from 'react';
import { useNavigate } from 'react-router';
import type { Cabinet } from '../../../../../shared/schemas/cabinet';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DetailList } from '../../../components/ui/detail-list';
import { formatCalendarDate, formatKilowatts, formatVolts } from '../../../lib/units';
import { cabinetsApi } from '../api/cabinets';
import { AuditTrail } from './audit-trail';
import { CabinetVisits } from './cabinet-visits';
import { BankTable } from './bank-table';
import { CabinetForm } from './cabinet-form';
import { useRegisterPermissions } from './permissions';
import { RecordHeader, RecordLoading, RetireButton } from './record-parts';
import { CabinetStatusBadge, CriticalityBadge } from './status-badges';
import { UpcomingWindows } from './upcoming-windows';

function MarkedWait({ minutes }: { minutes: number | null }) {
  if (minutes === null) return <span className="text-watch-600">Not recorded: read the marking on the drive</span>;
  return <span className="font-bold">{minutes} min</span>;
}

/**
 * A cabinet: details, banks with their latest verdict, visits to come, label and history.
 * `atTheCabinet` is shown first, under the tag (what a technician who scanned the label can do
 * there), composed by the app.
 */
export function CabinetPage({
  cabinetId,
  atTheCabinet,
  viewerId,
}: {
  cabinetId: string;
  atTheCabinet?: (cabinet: Cabinet) => ReactNode;
  /** The person looking: their own visits open on My visits. */
  viewerId?: string;
}) {
  const can = useRegisterPermissions();
  const cabinet = cabinetsApi.useDetail(cabinetId);
  const audit = cabinetsApi.useAudit(cabinetId);
  const retire = cabinetsApi.useRetire(cabinetId);
  if (!cabinet.data) return <RecordLoading query={cabinet} what="cabinet" />;
  const c: Cabinet = cabinet.data;
  const inUse = !c.retiredAt;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: '/register/cabinets', label: 'Cabinets' }}
        kind={`Cabinet · ${c.siteName} · ${c.areaName}`}
        title={<span className="font-mono">{c.tag}</span>}
        badges={
          <>
            <CabinetStatusBadge status={c.status} />
            <CriticalityBadge criticality={c.criticality} />
            <Badge tone="muted">
              {c.bankCount} bank{c.bankCount === 1 ? '' : 's'}
            </Badge>
          </>
        }
        actions={
          <>
            <ButtonLink to={`/register/cabinets/${c.id}/label`}>Print label</ButtonLink>
            {can.editRegister && inUse ? (
              <>
                <ButtonLink to={`/register/cabinets/${c.id}/edit`}>Edit</ButtonLink>
                <RetireButton
                  what={c.tag}
                  consequence="The cabinet and its banks in service leave the lists; their records and history stay. The tag becomes free for a new cabinet."
                  pending={retire.isPending}
                  error={retire.error}
                  onRetire={() => retire.mutate(c.version)}
                />
              </>
            ) : null}
          </>
        }
      />
      {inUse && atTheCabinet ? atTheCabinet(c) : null}
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card title="Details">
          <DetailList
            items={[
              { label: 'Site and area', value: `${c.siteName} · ${c.areaName}` },
              { label: 'Location', value: c.location },
              { label: 'Drive', value: [c.driveMake, c.driveModel].filter(Boolean).join(' ') },
              { label: 'Rated power', value: formatKilowatts(c.ratedPowerKilowatts) },
              { label: 'Supply (AC line)', value: formatVolts(c.supplyVolts) },
              { label: 'Nominal DC bus', value: formatVolts(c.dcBusVolts) },
              { label: "Maker's marked wait time", value: <MarkedWait minutes={c.markedWaitMinutes} /> },
              { label: 'Commissioned', value: formatCalendarDate(c.commissionedOn) },
              { label: 'Environment', value: c.environmentNotes, wide: true },
            ]}
          />
        </Card>
        <Card title="Visits">
          <CabinetVisits cabinetId={c.id} viewerId={viewerId} />
        </Card>
      </div>
      <Card title="Shutdown windows">
        <UpcomingWindows siteId={c.siteId} areaId={c.areaId} areaName={c.areaName} />
      </Card>
      <Card title="DC-link banks">
        <BankTable
          fixed={{ cabinetId: c.id }}
          action={
            can.editRegister && inUse ? (
              <ButtonLink to={`/register/banks/new?cabinetId=${c.id}`} variant="primary" size="sm">
                Add bank
              </ButtonLink>
            ) : undefined
          }
        />
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function CabinetNewScreen({ areaId }: { areaId?: string }) {
  const navigate = useNavigate();
  return (
    <div>
      <RecordHeader back={{ to: '/register/cabinets', label: 'Cabinets' }} kind="New cabinet" title="Add a cabinet" />
      <CabinetForm areaId={areaId} onSaved={(c) => navigate(`/register/cabinets/${c.id}`)} onCancel={() => navigate(-1)} />
    </div>
  );
}

export function CabinetEditScreen({ cabinetId }: { cabinetId: string }) {
  const navigate = useNavigate();
  const cabinet = cabinetsApi.useDetail(cabinetId);
  if (!cabinet.data) return <RecordLoading query={cabinet} what="cabinet" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/cabinets/${cabinetId}`, label: cabinet.data.tag }} kind="Edit cabinet" title={cabinet.data.tag} />
      <CabinetForm
        cabinet={cabinet.data}
        onSaved={() => navigate(`/register/cabinets/${cabinetId}`)}
        onCancel={() => navigate(`/register/cabinets/${cabinetId}`)}
      />
    </div>
  );
}
