/**
 * What a visit's answer says of its banks' decay runs: how many current runs each bank has on
 * the visit, and τ of the bank's newest accepted run (the phone spaces its prompts by it).
 * One query for a whole list of visits, never one per bank.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../db/sequelize';

/** What a visit's answer says of each of its banks' runs. */
export interface VisitBankRunFigures {
  /** τ of the bank's newest current accepted run (any visit), seconds; null when none. */
  lastTauSeconds: number | null;
  /** Current runs (not superseded) of this bank on this visit. */
  runCount: number;
}

/**
 * The run figures of every bank of the given visits, in one query: keyed by visit id, then bank id.
 */
export async function visitBankRunFigures(
  visitIds: readonly string[],
  transaction?: Transaction,
): Promise<Map<string, Map<string, VisitBankRunFigures>>> {
  const figures = new Map<string, Map<string, VisitBankRunFigures>>();
  if (visitIds.length === 0) return figures;
  const rows = await sequelize.query<{ visit_id: string; bank_id: string; run_count: number; last_tau_seconds: number | null }>(
    `SELECT vb.visit_id, vb.bank_id,
            (SELECT count(*)::int FROM decay_runs r
              WHERE r.visit_id = vb.visit_id AND r.bank_id = vb.bank_id
                AND NOT EXISTS (SELECT 1 FROM decay_runs n WHERE n.supersedes_id = r.id)) AS run_count,
            (SELECT r.tau_seconds FROM decay_runs r
              WHERE r.bank_id = vb.bank_id AND r.review_state = 'accepted' AND r.tau_seconds IS NOT NULL
                AND NOT EXISTS (SELECT 1 FROM decay_runs n WHERE n.supersedes_id = r.id)
              ORDER BY r.recorded_at DESC, r.version DESC LIMIT 1) AS last_tau_seconds
       FROM visit_banks vb
      WHERE vb.visit_id IN (:visitIds)`,
    { replacements: { visitIds: [...visitIds] }, type: QueryTypes.SELECT, transaction },
  );
  for (const row of rows) {
    let ofVisit = figures.get(row.visit_id);
    if (!ofVisit) figures.set(row.visit_id, (ofVisit = new Map()));
    ofVisit.set(row.bank_id, { lastTauSeconds: row.last_tau_seconds, runCount: row.run_count });
  }
  return figures;
}
