/**
 * What the Planner needs to open the form of a visit asked for by the Due list: the cabinet
 * (its site and area) and the shutdown windows of its area over the next 90 days.
 */
import { useQuery } from '@tanstack/react-query';
import type { Cabinet } from '../../../../../shared/schemas/cabinet';
import { apiFetch } from '../../../lib/api-client';
import { useWindowsInRange } from './shutdown-windows';

const LOOK_AHEAD_MS = 90 * 86_400_000;

/** The requested cabinet and its area's window occurrences; both wait while `cabinetId` is ''. */
export function usePlanRequestContext(cabinetId: string, nowMs: number) {
  const cabinet = useQuery({
    queryKey: ['planner-lookups', 'cabinet', cabinetId] as const,
    queryFn: () => apiFetch<Cabinet>(`/api/cabinets/${encodeURIComponent(cabinetId)}`),
    enabled: cabinetId !== '',
    staleTime: 60_000,
  });
  const from = new Date(nowMs).toISOString();
  const to = new Date(nowMs + LOOK_AHEAD_MS).toISOString();
  const windows = useWindowsInRange({ from, to, areaId: cabinet.data?.areaId }, cabinet.data !== undefined);
  return { cabinet, windows };
}
