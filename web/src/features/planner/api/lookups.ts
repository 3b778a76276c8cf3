/**
 * What the visit form picks from: sites, areas of a site, cabinets of an area, the banks of a
 * cabinet in service, and the technicians with their week's load.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Area } from '../../../../../shared/schemas/area';
import type { Bank } from '../../../../../shared/schemas/bank';
import type { Cabinet } from '../../../../../shared/schemas/cabinet';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Site } from '../../../../../shared/schemas/site';
import { apiFetch } from '../../../lib/api-client';
import type { TechnicianLoadList } from './shapes';

/** The register's largest page. */
const PAGE = 100;

export const plannerLookupKeys = {
  all: ['planner-lookups'] as const,
  sites: () => [...plannerLookupKeys.all, 'sites'] as const,
  areas: (siteId: string) => [...plannerLookupKeys.all, 'areas', siteId] as const,
  cabinets: (areaId: string, q: string) => [...plannerLookupKeys.all, 'cabinets', areaId, q] as const,
  banks: (cabinetId: string) => [...plannerLookupKeys.all, 'banks', cabinetId] as const,
};

export const sitesOptions = () =>
  queryOptions({
    queryKey: plannerLookupKeys.sites(),
    queryFn: () => apiFetch<ListPage<Site>>(`/api/sites?pageSize=${PAGE}&sort=name`),
    staleTime: 5 * 60_000,
  });

export const areasOptions = (siteId: string) =>
  queryOptions({
    queryKey: plannerLookupKeys.areas(siteId),
    queryFn: () => apiFetch<ListPage<Area>>(`/api/areas?pageSize=${PAGE}&sort=name&siteId=${encodeURIComponent(siteId)}`),
    staleTime: 5 * 60_000,
  });

export const cabinetsOptions = (areaId: string, q: string) =>
  queryOptions({
    queryKey: plannerLookupKeys.cabinets(areaId, q),
    queryFn: () =>
      apiFetch<ListPage<Cabinet>>(
        `/api/cabinets?pageSize=${PAGE}&sort=tag&status=in-service&areaId=${encodeURIComponent(areaId)}${q ? `&q=${encodeURIComponent(q)}` : ''}`,
      ),
    staleTime: 60_000,
  });

export const banksOptions = (cabinetId: string) =>
  queryOptions({
    queryKey: plannerLookupKeys.banks(cabinetId),
    queryFn: () => apiFetch<ListPage<Bank>>(`/api/banks?pageSize=${PAGE}&sort=position&status=in-service&cabinetId=${encodeURIComponent(cabinetId)}`),
    staleTime: 60_000,
  });

/**
 * GET /api/technician-load?weekOn=…&timeZone=…: every technician with the week's planned and
 * available hours, the week counted on the site's clock.
 */
export const technicianLoadOptions = (weekOn: string, timeZone: string) =>
  queryOptions({
    queryKey: ['technician-load', 'planner-picker', weekOn, timeZone] as const,
    queryFn: () => apiFetch<TechnicianLoadList>(`/api/technician-load?weekOn=${weekOn}&timeZone=${encodeURIComponent(timeZone)}`),
    staleTime: 60_000,
  });

export const useSites = () => useQuery(sitesOptions());
export const useAreas = (siteId: string) => useQuery({ ...areasOptions(siteId), enabled: siteId !== '' });
export const useCabinets = (areaId: string, q: string) => useQuery({ ...cabinetsOptions(areaId, q), enabled: areaId !== '' });
export const useBanks = (cabinetId: string) => useQuery({ ...banksOptions(cabinetId), enabled: cabinetId !== '' });
export const useTechnicians = (weekOn: string, timeZone: string) => useQuery(technicianLoadOptions(weekOn, timeZone));
