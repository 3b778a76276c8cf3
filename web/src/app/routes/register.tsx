import { useEffect, useRef, type ReactNode } from 'react';
import { Navigate, NavLink, Route, Routes, useLocation, useParams, useSearchParams } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';
import { useMe } from '../../features/auth/api/get-me';
import { DecayCheckPanel } from '../../features/decay-runs/components/decay-check-panel';
import { BankRunHistory } from '../../features/decay-runs/components/verdict/bank-run-history';
import { AreaEditScreen, AreaNewScreen, AreaPage } from '../../features/register/components/area-page';
import { BankDesignEditScreen, BankDesignList, BankDesignNewScreen, BankDesignPage } from '../../features/register/components/bank-design-page';
import { BankEditScreen, BankNewScreen, BankPage } from '../../features/register/components/bank-page';
import { BankList } from '../../features/register/components/bank-table';
import { CabinetImportScreen } from '../../features/register/components/cabinet-import';
import { CabinetLabelScreen } from '../../features/register/components/cabinet-label';
import { CabinetList } from '../../features/register/components/cabinet-list';
import { CabinetEditScreen, CabinetNewScreen, CabinetPage } from '../../features/register/components/cabinet-page';
import { permissionsFor, ReadOnlyNote, RegisterPermissionsProvider, useRegisterPermissions } from '../../features/register/components/permissions';
import { SiteList } from '../../features/register/components/site-list';
import { SiteEditScreen, SiteNewScreen, SitePage } from '../../features/register/components/site-page';
import { SpareEditScreen, SpareList, SpareNewScreen, SparePage } from '../../features/register/components/spare-pages';
import { StartAtCabinet } from '../../features/my-visits/components/start-at-cabinet';
import { hasAnyRole } from '../../../../shared/constants/roles';

const TABS = [
  { to: '/register/cabinets', label: 'Cabinets' },
  { to: '/register/banks', label: 'Banks' },
  { to: '/register/sites', label: 'Sites' },
  { to: '/register/bank-designs', label: 'Bank designs' },
  { to: '/register/spares', label: 'Spares' },
] as const;

function Tabs() {
  const nav = useRef<HTMLElement>(null);
  const { pathname } = useLocation();
  // on a phone the tabs scroll sideways: keep the open one in sight
  useEffect(() => {
    nav.current?.querySelector('[aria-current="page"]')?.scrollIntoView({ block: 'nearest', inline: 'center' });
  }, [pathname]);
  return (
    <nav ref={nav} aria-label="Register" className="-mx-4 mb-5 overflow-x-auto border-b border-tide-100 px-4 sm:mx-0 sm:px-0">
      <ul className="flex min-w-max gap-1">
        {TABS.map((tab) => (
          <li key={tab.to}>
            <NavLink
              to={tab.to}
              className={({ isActive }) =>
                `-mb-px block border-b-2 px-4 py-2.5 text-sm font-medium transition ${
                  isActive ? 'border-spark-400 text-tide-900' : 'border-transparent text-tide-600 hover:text-tide-900'
                }`
              }
            >
              {tab.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

/** Lists open with a line saying who may change them, for those who only read. */
function ListScreen({ children, note }: { children: ReactNode; note?: string }) {
  const can = useRegisterPermissions();
  return (
    <div className="space-y-3">
      {!can.editRegister && note ? <ReadOnlyNote>{note}</ReadOnlyNote> : null}
      {children}
    </div>
  );
}

/** A form screen for editors only; others are told, not shown a form that would be refused. */
function EditorsOnly({ allowed, children }: { allowed: boolean; children: ReactNode }) {
  return allowed ? <>{children}</> : <ReadOnlyNote>Your role reads this part of the register; changes are made by those who keep it.</ReadOnlyNote>;
}

function WithParam({ name, render }: { name: string; render: (value: string) => ReactNode }) {
  const params = useParams();
  return <>{render(params[name] ?? '')}</>;
}

function WithQuery({ name, render }: { name: string; render: (value: string | undefined) => ReactNode }) {
  const [search] = useSearchParams();
  return <>{render(search.get(name) ?? undefined)}</>;
}

function RegisterRoutes() {
  const can = useRegisterPermissions();
  // a technician who opened a cabinet by its label can start a visit there (and open it in My
  // visits, which is the technicians' screen; the API lets an admin start one too)
  const me = useMe().data;
  const startsVisits = hasAnyRole(me?.roles ?? [], ['technician']);
  const readNote = 'You can read the register. Planners and admins keep it.';
  return (
    <Routes>
      <Route index element={<Navigate to="cabinets" replace />} />
      <Route path="cabinets" element={<ListScreen note={readNote}><CabinetList /></ListScreen>} />
      <Route path="cabinets/new" element={<EditorsOnly allowed={can.editRegister}><WithQuery name="areaId" render={(areaId) => <CabinetNewScreen areaId={areaId} />} /></EditorsOnly>} />
      <Route path="cabinets/import" element={<CabinetImportScreen />} />
      <Route path="cabinets/:cabinetId" element={<WithParam name="cabinetId" render={(id) => <CabinetPage cabinetId={id} viewerId={me?.id} atTheCabinet={startsVisits ? (c) => <StartAtCabinet key={c.id} cabinetId={c.id} cabinetTag={c.tag} /> : undefined} />} />} />
      <Route path="cabinets/:cabinetId/edit" element={<EditorsOnly allowed={can.editRegister}><WithParam name="cabinetId" render={(id) => <CabinetEditScreen cabinetId={id} />} /></EditorsOnly>} />
      <Route path="cabinets/:cabinetId/label" element={<WithParam name="cabinetId" render={(id) => <CabinetLabelScreen cabinetId={id} />} />} />

      <Route path="banks" element={<ListScreen note={readNote}><BankList /></ListScreen>} />
      <Route path="banks/new" element={<EditorsOnly allowed={can.editRegister}><WithQuery name="cabinetId" render={(cabinetId) => <BankNewScreen cabinetId={cabinetId} />} /></EditorsOnly>} />
      <Route path="banks/:bankId" element={<WithParam name="bankId" render={(id) => <BankPage bankId={id} decayRuns={(bank) => <BankRunHistory key={`runs-${bank.id}`} bankId={bank.id} />} decayCheck={(bank) => <DecayCheckPanel key={bank.id} bank={bank} />} />} />} />
      <Route path="banks/:bankId/edit" element={<EditorsOnly allowed={can.editRegister}><WithParam name="bankId" render={(id) => <BankEditScreen bankId={id} />} /></EditorsOnly>} />

      <Route path="sites" element={<ListScreen note={readNote}><SiteList /></ListScreen>} />
      <Route path="sites/new" element={<EditorsOnly allowed={can.editRegister}><SiteNewScreen /></EditorsOnly>} />
      <Route path="sites/:siteId" element={<WithParam name="siteId" render={(id) => <SitePage siteId={id} />} />} />
      <Route path="sites/:siteId/edit" element={<EditorsOnly allowed={can.editRegister}><WithParam name="siteId" render={(id) => <SiteEditScreen siteId={id} />} /></EditorsOnly>} />

      <Route path="areas/new" element={<EditorsOnly allowed={can.editRegister}><WithQuery name="siteId" render={(siteId) => <AreaNewScreen siteId={siteId} />} /></EditorsOnly>} />
      <Route path="areas/:areaId" element={<WithParam name="areaId" render={(id) => <AreaPage areaId={id} />} />} />
      <Route path="areas/:areaId/edit" element={<EditorsOnly allowed={can.editRegister}><WithParam name="areaId" render={(id) => <AreaEditScreen areaId={id} />} /></EditorsOnly>} />

      <Route path="bank-designs" element={<ListScreen><BankDesignList /></ListScreen>} />
      <Route path="bank-designs/new" element={<EditorsOnly allowed={can.editDesigns}><BankDesignNewScreen /></EditorsOnly>} />
      <Route path="bank-designs/:designId" element={<WithParam name="designId" render={(id) => <BankDesignPage designId={id} />} />} />
      <Route path="bank-designs/:designId/edit" element={<EditorsOnly allowed={can.editDesigns}><WithParam name="designId" render={(id) => <BankDesignEditScreen designId={id} />} /></EditorsOnly>} />

      <Route path="spares" element={<ListScreen note={readNote}><SpareList /></ListScreen>} />
      <Route path="spares/new" element={<EditorsOnly allowed={can.editRegister}><SpareNewScreen /></EditorsOnly>} />
      <Route path="spares/:spareId" element={<WithParam name="spareId" render={(id) => <SparePage spareId={id} />} />} />
      <Route path="spares/:spareId/edit" element={<EditorsOnly allowed={can.editRegister}><WithParam name="spareId" render={(id) => <SpareEditScreen spareId={id} />} /></EditorsOnly>} />

      <Route path="*" element={<Navigate to="cabinets" replace />} />
    </Routes>
  );
}

/** Register: sites, areas, cabinets, banks, bank designs and spares. */
export function Component() {
  const me = useMe();
  const permissions = permissionsFor(me.data?.roles ?? [], me.data?.csrfToken ?? null);
  return (
    <RegisterPermissionsProvider value={permissions}>
      <div>
        <PageHeader title="Register" lead="Sites, areas, cabinets and their DC-link banks, bank designs and spares." />
        <Tabs />
        <RegisterRoutes />
      </div>
    </RegisterPermissionsProvider>
  );
}
