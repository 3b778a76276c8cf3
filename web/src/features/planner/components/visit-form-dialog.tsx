import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Field, Select, TextArea, TextInput } from '../../../components/ui/field';
import { Modal } from '../../../components/ui/modal';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { formatSeconds } from '../../../lib/units';
import { useAreas, useBanks, useCabinets, useSites, useTechnicians } from '../api/lookups';
import type { PlanningWarning, PlanningWarningKind } from '../api/shapes';
import { useCreateVisit, useVisitCheck } from '../api/visits';
import { draftInput, draftProblems, fieldErrors, weekOnOf, type VisitDraft } from '../utils/visit-form';
import { kindsMissingReason, overridesFor, warningsFromIssues } from '../utils/warnings';
import { fromZonedInputValue, toZonedInputValue } from '../utils/zoned-time';
import { WarningOverrides } from './warning-overrides';

/**
 * Plan a visit: site, area and cabinet, the cabinet's banks, the technicians, and the times in
 * the site's zone. The planning warnings are shown before saving, each accepted with a reason.
 */
export function VisitFormDialog({
  initial,
  fallbackZone,
  onClose,
}: {
  initial: Pick<VisitDraft, 'siteId' | 'areaId' | 'plannedStartAt' | 'plannedEndAt'> & Partial<Pick<VisitDraft, 'cabinetId' | 'bankIds'>>;
  /** The zone the times are read in until a site is chosen. */
  fallbackZone: string;
  onClose: (created: boolean) => void;
}) {
  const [draft, setDraft] = useState<VisitDraft>({
    ...initial,
    cabinetId: initial.cabinetId ?? '',
    bankIds: initial.bankIds ?? [],
    technicianIds: [],
    notes: '',
  });
  const [cabinetSearch, setCabinetSearch] = useState('');
  const [reasons, setReasons] = useState<Partial<Record<PlanningWarningKind, string>>>({});
  const [serverWarnings, setServerWarnings] = useState<PlanningWarning[] | null>(null);
  const [tried, setTried] = useState(false);

  const sites = useSites();
  const areas = useAreas(draft.siteId);
  const cabinets = useCabinets(draft.areaId, cabinetSearch.trim());
  const banks = useBanks(draft.cabinetId);
  const site = sites.data?.items.find((s) => s.id === draft.siteId);
  const zone = site?.timeZone ?? fallbackZone;
  const technicians = useTechnicians(weekOnOf(draft.plannedStartAt, zone), zone);

  const input = draftInput(draft);
  const check = useVisitCheck(input);
  const create = useCreateVisit();
  const warnings = serverWarnings ?? check.data?.warnings ?? [];
  const missing = kindsMissingReason(warnings, reasons);
  const problems = draftProblems(draft);
  const apiErrors = create.error instanceof ApiError && create.error.status === 400 ? fieldErrors(create.error.issues) : {};
  const errorOf = (field: keyof VisitDraft) => apiErrors[field] ?? (tried ? problems[field] : undefined);

  function update(change: Partial<VisitDraft>) {
    setServerWarnings(null);
    setDraft((d) => ({ ...d, ...change }));
  }

  function save() {
    setTried(true);
    if (!input || missing.length > 0 || check.isPending) return;
    create.mutate(
      { ...input, overrides: overridesFor(warnings, reasons) },
      {
        onSuccess: () => onClose(true),
        onError: (error) => {
          if (error instanceof ApiError && error.code === 'override-needed') setServerWarnings(warningsFromIssues(error.issues));
        },
      },
    );
  }

  const refusal = create.error instanceof ApiError && create.error.status !== 400 && create.error.code !== 'override-needed' ? create.error : null;
  const toggle = (list: string[], id: string, on: boolean) => (on ? [...list, id] : list.filter((x) => x !== id));

  return (
    <Modal title="Plan a visit" onClose={() => onClose(false)} wide>
      <form
        className="space-y-4"
        noValidate
        onSubmit={(event) => {
          event.preventDefault();
          save();
        }}
      >
        <div className="grid gap-3 sm:grid-cols-2">
          <Field id="visit-site" label="Site" required error={errorOf('siteId')}>
            <Select id="visit-site" value={draft.siteId} onChange={(e) => update({ siteId: e.target.value, areaId: '', cabinetId: '', bankIds: [] })}>
              <option value="">Choose a site…</option>
              {sites.data?.items.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name} ({s.timeZone})
                </option>
              ))}
            </Select>
          </Field>
          <Field id="visit-area" label="Area" required error={errorOf('areaId')}>
            <Select
              id="visit-area"
              value={draft.areaId}
              disabled={!draft.siteId}
              onChange={(e) => update({ areaId: e.target.value, cabinetId: '', bankIds: [] })}
            >
              <option value="">{draft.siteId ? 'Choose an area…' : 'Choose a site first'}</option>
              {areas.data?.items.map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="visit-cabinet-search" label="Find a cabinet" hint="Tag or name; the list shows the area's cabinets in service.">
            <TextInput
              id="visit-cabinet-search"
              type="search"
              value={cabinetSearch}
              disabled={!draft.areaId}
              onChange={(e) => setCabinetSearch(e.target.value)}
              placeholder="e.g. VFD-014"
            />
          </Field>
          <Field id="visit-cabinet" label="Cabinet" required error={errorOf('cabinetId')}>
            <Select
              id="visit-cabinet"
              value={draft.cabinetId}
              disabled={!draft.areaId}
              onChange={(e) => update({ cabinetId: e.target.value, bankIds: [] })}
            >
              <option value="">{draft.areaId ? (cabinets.isPending ? 'Loading…' : 'Choose a cabinet…') : 'Choose an area first'}</option>
              {cabinets.data?.items.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.tag}
                  {c.location ? ` · ${c.location}` : ''}
                </option>
              ))}
            </Select>
          </Field>
        </div>

        <fieldset aria-describedby={errorOf('bankIds') ? 'visit-banks-error' : undefined}>
          <legend className="mb-1 text-sm font-medium text-tide-900">
            Banks <span className="text-eol-600" aria-hidden="true">*</span>
          </legend>
          {!draft.cabinetId ? (
            <p className="text-sm text-tide-600">Choose a cabinet to see its banks in service.</p>
          ) : banks.isPending ? (
            <Spinner label="Loading banks" />
          ) : banks.data?.items.length === 0 ? (
            <p className="text-sm text-tide-600">This cabinet has no bank in service.</p>
          ) : (
            <div className="flex flex-wrap gap-2">
              {draft.cabinetId && banks.data && draft.bankIds.length === 0 && banks.data.items.length > 1 ? (
                <Button size="sm" variant="ghost" onClick={() => update({ bankIds: banks.data.items.map((b) => b.id) })}>
                  Tick every bank
                </Button>
              ) : null}
              {banks.data?.items.map((bank) => (
                <label key={bank.id} className="flex min-h-10 items-center gap-2 rounded-lg border border-tide-100 px-3 py-1.5 text-sm">
                  <input
                    type="checkbox"
                    className="size-4 accent-tide-800"
                    checked={draft.bankIds.includes(bank.id)}
                    onChange={(e) => update({ bankIds: toggle(draft.bankIds, bank.id, e.target.checked) })}
                  />
                  <span>
                    {bank.position} · {bank.bankDesignCode}
                    {bank.baseline ? <span className="text-tide-600"> · τ {formatSeconds(bank.baseline.tauSeconds)}</span> : null}
                  </span>
                </label>
              ))}
            </div>
          )}
          {errorOf('bankIds') ? (
            <p id="visit-banks-error" className="mt-1 text-sm font-medium text-eol-600">
              {errorOf('bankIds')}
            </p>
          ) : null}
        </fieldset>

        <div className="grid gap-3 sm:grid-cols-2">
          <Field id="visit-start" label={`Start (${zone})`} required error={errorOf('plannedStartAt')}>
            <TextInput
              id="visit-start"
              type="datetime-local"
              value={draft.plannedStartAt ? toZonedInputValue(draft.plannedStartAt, zone) : ''}
              onChange={(e) => update({ plannedStartAt: fromZonedInputValue(e.target.value, zone) ?? '' })}
            />
          </Field>
          <Field id="visit-end" label={`End (${zone})`} required error={errorOf('plannedEndAt')}>
            <TextInput
              id="visit-end"
              type="datetime-local"
              value={draft.plannedEndAt ? toZonedInputValue(draft.plannedEndAt, zone) : ''}
              onChange={(e) => update({ plannedEndAt: fromZonedInputValue(e.target.value, zone) ?? '' })}
            />
          </Field>
        </div>

        <fieldset>
          <legend className="mb-1 text-sm font-medium text-tide-900">
            Technicians <span className="text-eol-600" aria-hidden="true">*</span>
          </legend>
          {technicians.isPending ? (
            <Spinner label="Loading technicians" />
          ) : technicians.isError ? (
            <p className="text-sm font-medium text-eol-600">The technicians could not be loaded: {technicians.error.message}</p>
          ) : technicians.data.items.length === 0 ? (
            <p className="text-sm text-tide-600">Nobody holds the technician role yet; an admin gives it on People.</p>
          ) : (
            <div className="grid gap-2 sm:grid-cols-2">
              {technicians.data.items.map((t) => (
                <label key={t.technicianId} className="flex min-h-10 items-center gap-2 rounded-lg border border-tide-100 px-3 py-1.5 text-sm">
                  <input
                    type="checkbox"
                    className="size-4 accent-tide-800"
                    checked={draft.technicianIds.includes(t.technicianId)}
                    onChange={(e) => update({ technicianIds: toggle(draft.technicianIds, t.technicianId, e.target.checked) })}
                  />
                  <span className="min-w-0 flex-1">{t.name}</span>
                  <span className={`text-xs ${t.plannedHours > t.availableHours ? 'font-bold text-eol-600' : 'text-tide-600'}`}>
                    {formatHours(t.plannedHours)} of {formatHours(t.availableHours)} h that week
                  </span>
                </label>
              ))}
            </div>
          )}
          {errorOf('technicianIds') ? <p className="mt-1 text-sm font-medium text-eol-600">{errorOf('technicianIds')}</p> : null}
        </fieldset>

        <Field id="visit-notes" label="Notes" hint="For the technicians: access, keys, who to call.">
          <TextArea id="visit-notes" rows={2} value={draft.notes} onChange={(e) => setDraft((d) => ({ ...d, notes: e.target.value }))} />
        </Field>

        {input ? (
          check.isError ? (
            <p className="text-sm font-medium text-eol-600">The warnings could not be checked: {check.error.message}</p>
          ) : (
            <WarningOverrides
              idPrefix="visit"
              warnings={warnings}
              reasons={reasons}
              checking={check.isPending}
              onReason={(kind, value) => setReasons((r) => ({ ...r, [kind]: value }))}
            />
          )
        ) : (
          <p className="text-sm text-tide-600">Once cabinet, banks, technicians and times are chosen, the warnings show here before saving.</p>
        )}

        {refusal ? (
          <p role="alert" className="text-sm font-medium text-eol-600">
            Not planned: {refusal.message}
          </p>
        ) : null}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="primary" disabled={create.isPending || (input !== null && (check.isPending || missing.length > 0))}>
            {create.isPending ? 'Planning…' : 'Plan visit'}
          </Button>
          <Button onClick={() => onClose(false)} disabled={create.isPending}>
            Cancel
          </Button>
        </div>
      </form>
    </Modal>
  );
}

function formatHours(hours: number): string {
  return hours.toLocaleString('en-GB', { maximumFractionDigits: 1 });
}
