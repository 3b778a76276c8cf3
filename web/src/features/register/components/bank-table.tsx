import type { ReactNode } from 'react';
import { BANK_STATUSES, BANK_STATUS_LABELS } from '../../../../../shared/constants/register';
import type { Bank } from '../../../../../shared/schemas/bank';
import { ButtonLink } from '../../../components/ui/button';
import type { DataColumn } from '../../../components/ui/data-table';
import { formatCalendarDate, formatMicrofarads, formatSeconds } from '../../../lib/units';
import { banksApi } from '../api/banks';
import { useListParams } from '../hooks/use-list-params';
import { FlagToggle, ListResults, ListSearch, ParamSelect, SiteFilter } from './list-controls';
import { useRegisterPermissions } from './permissions';
import { ListToolbar } from './record-parts';
import { BankStatusBadge, BaselineSourceBadge, LatestVerdict, Tau } from './status-badges';

const cabinetColumn: DataColumn<Bank> = {
  id: 'cabinet',
  header: 'Cabinet',
  cell: ({ row }) => <span className="font-mono">{row.original.cabinetTag}</span>,
};

const bankColumns: DataColumn<Bank>[] = [
  { id: 'position', header: 'Position', cell: ({ row }) => row.original.position },
  { id: 'verdict', header: 'Latest verdict', enableSorting: false, cell: ({ row }) => <LatestVerdict verdict={row.original.latestVerdict} /> },
  {
    id: 'design',
    header: 'Design',
    cell: ({ row }) => (
      <span className="font-mono" title={`${row.original.bankDesignName} (${row.original.technology})`}>
        {row.original.bankDesignCode}
      </span>
    ),
  },
  { id: 'nominal', header: 'Nominal C', enableSorting: false, cell: ({ row }) => formatMicrofarads(row.original.nominalCapacitanceMicrofarads) },
  {
    id: 'baseline',
    header: () => (
      <>
        Baseline <Tau />
      </>
    ),
    enableSorting: false,
    cell: ({ row }) => (
      <span>
        {formatSeconds(row.original.baseline.tauSeconds)} <BaselineSourceBadge source={row.original.baseline.source} />
      </span>
    ),
  },
  { id: 'installedOn', header: 'Installed', cell: ({ row }) => formatCalendarDate(row.original.installedOn) },
  { id: 'status', header: 'Status', cell: ({ row }) => <BankStatusBadge status={row.original.status} /> },
];

function BankCard({ bank: b, showCabinet }: { bank: Bank; showCabinet: boolean }) {
  return (
    <div>
      <div className="flex items-start justify-between gap-2">
        <p className="font-bold text-tide-900">
          {showCabinet ? <span className="mr-1 font-mono">{b.cabinetTag}</span> : null}
          {b.position}
        </p>
        <LatestVerdict verdict={b.latestVerdict} />
      </div>
      <p className="mt-0.5 text-sm text-tide-800">
        <span className="font-mono">{b.bankDesignCode}</span> · {formatMicrofarads(b.nominalCapacitanceMicrofarads)}
      </p>
      <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-tide-600">
        τ₀ {formatSeconds(b.baseline.tauSeconds)} <BaselineSourceBadge source={b.baseline.source} />
        {b.status !== 'in-service' ? <BankStatusBadge status={b.status} /> : null}
      </p>
    </div>
  );
}

/** Banks, server-paged and sorted; `fixed` pins filters (e.g. one cabinet's banks). */
export function BankTable({
  fixed = {},
  toolbar = false,
  action,
}: {
  fixed?: Record<string, string>;
  toolbar?: boolean;
  /** Shown beside the embedded list's own controls, e.g. "Add bank". */
  action?: ReactNode;
}) {
  const can = useRegisterPermissions();
  const inCabinet = 'cabinetId' in fixed;
  const embedded = !toolbar;
  const [params, update] = useListParams({ sort: inCabinet ? 'position' : 'cabinet', pageSize: inCabinet ? 50 : embedded ? 10 : 25 }, [
    'siteId',
    'status',
    'includeRetired',
  ]);
  const banks = banksApi.useList({ ...params, ...fixed });
  return (
    <section aria-label="Banks">
      {toolbar ? (
        <ListToolbar
          search={<ListSearch params={params} update={update} label="Search banks" placeholder="Cabinet tag, position or serial" />}
          action={can.editRegister ? <ButtonLink to="/register/banks/new" variant="primary">Add bank</ButtonLink> : undefined}
        >
          <SiteFilter params={params} update={update} />
          <ParamSelect
            params={params}
            update={update}
            name="status"
            label="Status"
            allLabel="In service"
            options={BANK_STATUSES.map((s) => ({ value: s, label: BANK_STATUS_LABELS[s] }))}
          />
        </ListToolbar>
      ) : inCabinet ? (
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          <div>{action}</div>
          <FlagToggle params={params} update={update} name="includeRetired" label="Show replaced and removed" />
        </div>
      ) : null}
      <ListResults
        query={banks}
        params={params}
        update={update}
        pageSizeChoice={toolbar}
        caption="Banks"
        columns={
          inCabinet
            ? bankColumns
            : [cabinetColumn, ...bankColumns.filter((c) => !('bankDesignId' in fixed) || c.id !== 'design')]
        }
        rowKey={(b) => b.id}
        rowHref={(b) => `/register/banks/${b.id}`}
        empty={inCabinet ? 'No banks recorded in this cabinet yet.' : params.q ? `No bank matches “${params.q}”.` : 'No banks yet.'}
        card={(b) => <BankCard bank={b} showCabinet={!inCabinet} />}
      />
    </section>
  );
}

export function BankList() {
  return <BankTable toolbar />;
}
