/**
 * Plan a shutdown window: the body of `POST /api/shutdown-windows/:windowId/proposal` and its
 * answer. The proposal stores nothing; the planner confirms its rows (edited or not) with
 * `POST /api/visits/batch`, in one transaction.
 */
import { z } from 'zod';
import type { LeftOutKind } from '../domain/plan-window';
import { recordId } from './common';
import { instant } from './visit';

/** What the planner asks a proposal for: one occurrence, and optionally the technicians to use. */
export const windowProposalRequestSchema = z.object({
  /** The start of the occurrence to plan (one of the window's occurrences), UTC ISO. */
  occurrenceStartsAt: instant('occurrence start'),
  /** The technicians to split the visits across; left out: those available at the window's site. */
  technicianIds: z
    .array(recordId('technician'), { error: 'Send technicianIds as a list of person ids.' })
    .min(1, 'Choose at least one technician, or leave technicianIds out.')
    .max(100, 'Choose at most 100 technicians.')
    .refine((ids) => new Set(ids).size === ids.length, 'Choose each technician once.')
    .optional(),
});
export type WindowProposalRequest = z.output<typeof windowProposalRequestSchema>;

/** A bank of a proposed visit. */
export interface ProposedVisitBank {
  id: string;
  position: string;
  baselineTauSeconds: number;
  /** Its due date, `YYYY-MM-DD` (due rule of shared/domain/due.ts). */
  dueOn: string;
  /** Setup + 5 τ + marked wait, minutes (not rounded). */
  estimatedMinutes: number;
}

/**
 * A proposed visit: the fields of a visit to create (`cabinetId`, `bankIds`, `plannedStartAt`,
 * `plannedEndAt`, `technicianIds`, `notes`) and what the screen shows beside them.
 */
export interface ProposedWindowVisit {
  cabinetId: string;
  cabinetTag: string;
  /** The drive maker's marked wait, minutes; null when the register has none (15 min planned). */
  markedWaitMinutes: number | null;
  bankIds: string[];
  banks: ProposedVisitBank[];
  technicianIds: string[];
  technicians: { id: string; name: string }[];
  plannedStartAt: string;
  plannedEndAt: string;
  notes: string;
  /** Whole minutes. */
  estimatedMinutes: number;
}

/** Why a bank is not in the proposal: the plan's own reasons, or a visit already planned for it. */
export type ProposalLeftOutKind = LeftOutKind | 'already-planned';

/** A bank due by the window's end that the proposal leaves out, with the reason. */
export interface ProposalLeftOutBank {
  bankId: string;
  cabinetId: string;
  cabinetTag: string;
  position: string;
  dueOn: string;
  kind: ProposalLeftOutKind;
  reason: string;
}

/** Where the proposal's technicians come from. */
export type TechnicianPool = 'site' | 'all' | 'chosen';

/** The answer of a proposal. */
export interface WindowProposal {
  /** The window and the occurrence planned (`startsAt`, `endsAt` are the occurrence's). */
  window: {
    id: string;
    title: string;
    areaId: string;
    areaName: string;
    siteId: string;
    siteName: string;
    timeZone: string;
    startsAt: string;
    endsAt: string;
  };
  /** Banks due on or before this day (the occurrence's last local day) are planned. */
  dueBy: string;
  visits: ProposedWindowVisit[];
  leftOut: ProposalLeftOutBank[];
  /**
   * The technicians the visits were split across, in the order ties go to (by name): those
   * attached to the window's site (`site`), every technician when nobody is attached to it
   * (`all`), or those the planner chose (`chosen`). `busy` are the visits each already has
   * during the occurrence: the proposal plans around them, and so must an edit of its rows.
   */
  technicians: {
    id: string;
    name: string;
    busy: { startsAt: string; endsAt: string; cabinetTag: string }[];
  }[];
  technicianPool: TechnicianPool;
  /** Technicians who already have visits during the occurrence, each saying which (planned around). */
  busyTechnicians: { id: string; name: string; reason: string }[];
}
