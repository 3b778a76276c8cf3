/**
 * Plan a window on the demo: every shutdown window's next occurrence gets a proposal whose
 * visits the visit batch accepts as they are (no warning to override), so a planner new to
 * Ebbline can plan next week's shutdown in one step.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { seedDemo } from '../../../infra/seed/index';
import type { WindowProposal } from '../../../shared/schemas/plan-window';
import type { ShutdownWindow } from '../../../shared/schemas/shutdown-window';
import { createCaller } from '../../support/auth';

const app = createApp();
let auth: string;

beforeAll(async () => {
  await seedDemo({ now: new Date() });
  auth = (await createCaller(['planner'])).auth;
}, 120_000);

describe('plan a window on the demo', () => {
  it('when the coming occurrences are proposed, then each proposal is whole and the first with visits is planned by the batch as it is', async () => {
    const now = Date.now();
    const from = new Date(now).toISOString();
    const to = new Date(now + 28 * 86_400_000).toISOString();
    const list = await request(app)
      .get(`/api/shutdown-windows?from=${from}&to=${to}&pageSize=200`)
      .set('Authorization', auth);
    expect(list.status).toBe(200);
    const occurrences = (list.body.items as ShutdownWindow[]).flatMap((w) =>
      (w.occurrences ?? [])
        .filter((o) => Date.parse(o.startsAt) > now)
        .map((o) => ({ window: w, startsAt: o.startsAt })),
    );
    expect(occurrences.length).toBeGreaterThan(0);

    const proposals: WindowProposal[] = [];
    for (const { window, startsAt } of occurrences) {
      const res = await request(app)
        .post(`/api/shutdown-windows/${window.id}/proposal`)
        .set('Authorization', auth)
        .send({ occurrenceStartsAt: startsAt });
      expect(
        res.status,
        `${window.title} ${startsAt}: ${JSON.stringify(res.body).slice(0, 300)}`,
      ).toBe(200);
      const proposal = res.body as WindowProposal;
      for (const visit of proposal.visits) {
        expect(Date.parse(visit.plannedStartAt)).toBeGreaterThanOrEqual(
          Date.parse(proposal.window.startsAt),
        );
        expect(Date.parse(visit.plannedEndAt)).toBeLessThanOrEqual(
          Date.parse(proposal.window.endsAt),
        );
      }
      proposals.push(proposal);
    }
    const withVisits = proposals.find((p) => p.visits.length > 0);
    expect(withVisits, 'some coming occurrence has due banks and free technicians').toBeDefined();
    const countVisits = async () =>
      (
        (await sequelize.query('SELECT count(*)::int AS count FROM visits'))[0] as Array<{
          count: number;
        }>
      )[0]!.count;
    const before = await countVisits();
    const visits = withVisits!.visits.map(
      ({ cabinetId, bankIds, plannedStartAt, plannedEndAt, technicianIds, notes }) => ({
        cabinetId,
        bankIds,
        plannedStartAt,
        plannedEndAt,
        technicianIds,
        notes,
      }),
    );
    const res = await request(app)
      .post('/api/visits/batch')
      .set('Authorization', auth)
      .send({ visits });
    expect(res.status, JSON.stringify(res.body).slice(0, 600)).toBe(201);
    expect(await countVisits()).toBe(before + visits.length);
    console.log(
      proposals
        .map(
          (p) =>
            `${p.window.title} ${p.window.startsAt}: ${p.visits.length} visits, ${p.leftOut.length} left out, ${p.technicians.length} technicians`,
        )
        .join('\n'),
    );
  }, 120_000);
});
