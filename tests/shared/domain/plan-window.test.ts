import { describe, expect, it } from 'vitest';
import {
  packProposalRows,
  proposeWindowPlan,
  type PlanCabinet,
  type PlanTechnician,
} from '../../../shared/domain/plan-window';

/*
 * The hand-computed case.
 *
 * Window: Saturday 9 January 2027, 06:00–08:00 Europe/Berlin (winter time, UTC+1), i.e.
 * 05:00Z–07:00Z: 120 minutes. Technicians, in this order: Ana Brandt, Ben Okafor.
 *
 * Per bank: 15 min setup + 5 τ of capture + the cabinet's marked wait (15 min when unknown).
 *
 *   cabinet  banks      τ       5 τ      marked wait   per bank               visit
 *   DR-101   DC1, DC2   120 s   10 min   5 min         15 + 10 + 5  = 30 min   60 min
 *   DR-102   DC1        240 s   20 min   10 min        15 + 20 + 10 = 45 min   45 min
 *   DR-103   DC1         60 s    5 min   unknown → 15  15 +  5 + 15 = 35 min   35 min
 *   DR-104   DC1, DC2   180 s   15 min   5 min         15 + 15 + 5  = 35 min   70 min
 *   DR-105   DC1        300 s   25 min   10 min        15 + 25 + 10 = 50 min   50 min
 *
 * Longest first: DR-104 (70), DR-101 (60), DR-105 (50), DR-102 (45), DR-103 (35).
 * Both technicians are free at 06:00.
 *   1. DR-104 → Ana (free 06:00; tie with Ben, Ana is first)  06:00–07:10; Ana free at 07:10.
 *   2. DR-101 → Ben (free 06:00 < Ana's 07:10)                06:00–07:00; Ben free at 07:00.
 *   3. DR-105 → Ben (07:00 < 07:10)                           07:00–07:50; Ben free at 07:50.
 *   4. DR-102 → Ana (07:10 < 07:50)                           07:10–07:55; Ana free at 07:55.
 *   5. DR-103 → Ben is free soonest (07:50 < 07:55) with 10 min left; the bank needs 35 min
 *      and would end at 08:25, after the window's end at 08:00: DR-103 DC1 is left out (Ana,
 *      with 5 min left, could not take it either).
 * In UTC (minus one hour): DR-104 05:00–06:10, DR-101 05:00–06:00, DR-105 06:00–06:50,
 * DR-102 06:10–06:55. Planned: 70 + 60 + 50 + 45 = 225 of the 240 technician-minutes.
 */
const occurrence = {
  startsAt: '2027-01-09T05:00:00Z',
  endsAt: '2027-01-09T07:00:00Z',
  timeZone: 'Europe/Berlin',
};
const ana: PlanTechnician = { id: 't-ana', name: 'Ana Brandt' };
const ben: PlanTechnician = { id: 't-ben', name: 'Ben Okafor' };

function cabinet(
  tag: string,
  markedWaitMinutes: number | null,
  tauSeconds: number,
  positions: string[],
): PlanCabinet {
  return {
    cabinetId: `c-${tag}`,
    cabinetTag: tag,
    markedWaitMinutes,
    banks: positions.map((position) => ({
      bankId: `b-${tag}-${position}`,
      position,
      baselineTauSeconds: tauSeconds,
    })),
  };
}

const handCase: PlanCabinet[] = [
  cabinet('DR-101', 5, 120, ['DC1', 'DC2']),
  cabinet('DR-102', 10, 240, ['DC1']),
  cabinet('DR-103', null, 60, ['DC1']),
  cabinet('DR-104', 5, 180, ['DC1', 'DC2']),
  cabinet('DR-105', 10, 300, ['DC1']),
];

describe('proposeWindowPlan', () => {
  it('when the hand-computed case is planned, then the visits, technicians and times are those worked out above', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    expect(
      plan.visits.map((v) => [
        v.cabinetTag,
        v.technicianIds,
        v.plannedStartAt,
        v.plannedEndAt,
        v.estimatedMinutes,
      ]),
    ).toEqual([
      ['DR-104', ['t-ana'], '2027-01-09T05:00:00.000Z', '2027-01-09T06:10:00.000Z', 70],
      ['DR-101', ['t-ben'], '2027-01-09T05:00:00.000Z', '2027-01-09T06:00:00.000Z', 60],
      ['DR-105', ['t-ben'], '2027-01-09T06:00:00.000Z', '2027-01-09T06:50:00.000Z', 50],
      ['DR-102', ['t-ana'], '2027-01-09T06:10:00.000Z', '2027-01-09T06:55:00.000Z', 45],
    ]);
    expect(plan.visits[0]!.bankIds).toEqual(['b-DR-104-DC1', 'b-DR-104-DC2']);
    expect(plan.visits[0]!.banks.map((b) => b.estimatedMinutes)).toEqual([35, 35]);
    expect(plan.visits.reduce((sum, v) => sum + v.estimatedMinutes, 0)).toBe(225);
  });

  it('when the hand-computed case is planned, then DR-103’s bank is left out because it would pass the window’s end, with the times in the site’s zone', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    expect(plan.leftOut).toEqual([
      {
        bankId: 'b-DR-103-DC1',
        cabinetId: 'c-DR-103',
        cabinetTag: 'DR-103',
        position: 'DC1',
        kind: 'past-window-end',
        reason:
          'Needs about 35 min; Ben Okafor, free soonest (from 07:50), would finish at 08:25, after the window ends at 08:00 (Europe/Berlin).',
      },
    ]);
  });

  it('when no visit ends after the occurrence’s end and no technician’s visits overlap, then the proposal keeps both rules', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    for (const visit of plan.visits)
      expect(Date.parse(visit.plannedEndAt)).toBeLessThanOrEqual(Date.parse(occurrence.endsAt));
    for (const technician of [ana, ben]) {
      const own = plan.visits.filter((v) => v.technicianIds.includes(technician.id));
      for (let i = 1; i < own.length; i += 1) {
        expect(Date.parse(own[i]!.plannedStartAt)).toBeGreaterThanOrEqual(
          Date.parse(own[i - 1]!.plannedEndAt),
        );
      }
    }
  });

  it('when the cabinets come in another order, then the proposal is the same', () => {
    const forward = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    const reversed = proposeWindowPlan({
      occurrence,
      cabinets: [...handCase].reverse(),
      technicians: [ana, ben],
    });
    expect(reversed).toEqual(forward);
  });

  it('when only some of a cabinet’s banks fit, then the visit keeps those in position order and leaves the rest out', () => {
    // one technician, 60 min: DC1, DC2, DC10 of 30 min each (τ 120 s, wait 5): DC1 + DC2 fit, DC10 does not
    const plan = proposeWindowPlan({
      occurrence: { ...occurrence, endsAt: '2027-01-09T06:00:00Z' },
      cabinets: [cabinet('DR-201', 5, 120, ['DC10', 'DC2', 'DC1'])],
      technicians: [ana],
    });
    expect(plan.visits).toHaveLength(1);
    expect(plan.visits[0]!.banks.map((b) => b.position)).toEqual(['DC1', 'DC2']);
    expect(plan.visits[0]!.plannedEndAt).toBe('2027-01-09T06:00:00.000Z');
    expect(plan.leftOut.map((b) => [b.position, b.kind])).toEqual([['DC10', 'past-window-end']]);
    expect(plan.leftOut[0]!.reason).toContain('from 07:00');
    expect(plan.leftOut[0]!.reason).toContain('would finish at 07:30');
  });

  it('when a visit ends exactly at the occurrence’s end, then it fits', () => {
    const plan = proposeWindowPlan({
      occurrence: { ...occurrence, endsAt: '2027-01-09T05:30:00Z' },
      cabinets: [cabinet('DR-301', 5, 120, ['DC1'])],
      technicians: [ana],
    });
    expect(plan.visits.map((v) => v.plannedEndAt)).toEqual(['2027-01-09T05:30:00.000Z']);
    expect(plan.leftOut).toEqual([]);
  });

  it('when there is no technician, then every bank is left out saying so', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [] });
    expect(plan.visits).toEqual([]);
    expect(plan.leftOut).toHaveLength(7);
    expect(new Set(plan.leftOut.map((b) => b.kind))).toEqual(new Set(['no-technician']));
  });

  it('when a cabinet has no banks to cover, then it gets no visit', () => {
    const plan = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-401', 5, 120, [])],
      technicians: [ana],
    });
    expect(plan).toEqual({ visits: [], leftOut: [] });
  });

  it('when two visits are as long, then the cabinet tag decides which goes first', () => {
    const plan = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-9', 5, 120, ['DC1']), cabinet('DR-10', 5, 120, ['DC1'])],
      technicians: [ana],
    });
    expect(plan.visits.map((v) => v.cabinetTag)).toEqual(['DR-9', 'DR-10']);
  });

  it('when the occurrence spans the change to summer time, then durations are real minutes and the reasons show the site’s clock', () => {
    // 28 Mar 2027, Europe/Berlin: 02:00 CET becomes 03:00 CEST, so 00:00Z–02:00Z is 01:00–04:00 on the
    // site's clock but two real hours
    const dst = {
      startsAt: '2027-03-28T00:00:00Z',
      endsAt: '2027-03-28T02:00:00Z',
      timeZone: 'Europe/Berlin',
    };
    const plan = proposeWindowPlan({
      occurrence: dst,
      cabinets: [
        cabinet('DR-501', 5, 120, ['DC1', 'DC2', 'DC3']),
        cabinet('DR-502', 5, 120, ['DC1']),
      ],
      technicians: [ana],
    });
    // DR-501: 90 min, 00:00Z–01:30Z (01:00 CET to 03:30 CEST); DR-502 needs 30 min, only 30 are left: it fits
    expect(plan.visits.map((v) => [v.cabinetTag, v.plannedStartAt, v.plannedEndAt])).toEqual([
      ['DR-501', '2027-03-28T00:00:00.000Z', '2027-03-28T01:30:00.000Z'],
      ['DR-502', '2027-03-28T01:30:00.000Z', '2027-03-28T02:00:00.000Z'],
    ]);
    const tight = proposeWindowPlan({
      occurrence: { ...dst, endsAt: '2027-03-28T01:45:00Z' },
      cabinets: [
        cabinet('DR-501', 5, 120, ['DC1', 'DC2', 'DC3']),
        cabinet('DR-502', 5, 120, ['DC1']),
      ],
      technicians: [ana],
    });
    expect(tight.leftOut[0]!.reason).toBe(
      'Needs about 30 min; Ana Brandt, free soonest (from 03:30), would finish at 04:00, after the window ends at 03:45 (Europe/Berlin).',
    );
  });

  it('when the occurrence ends before it starts, then it refuses', () => {
    expect(() =>
      proposeWindowPlan({
        occurrence: { ...occurrence, endsAt: occurrence.startsAt },
        cabinets: handCase,
        technicians: [ana],
      }),
    ).toThrow(RangeError);
  });
});

describe('proposeWindowPlan around visits the technicians already have', () => {
  it('when Ana is busy 06:00–06:30 local, then the longest visit goes to Ben at 06:00 and the next to Ana after her visit', () => {
    // DR-A: 2 banks of 30 min = 60 min; DR-B: 1 bank = 30 min. Longest first:
    // DR-A: Ana could start 06:30, Ben 06:00 → Ben 06:00–07:00. DR-B: Ana 06:30, Ben 07:00 → Ana 06:30–07:00.
    const plan = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-A', 5, 120, ['DC1', 'DC2']), cabinet('DR-B', 5, 120, ['DC1'])],
      technicians: [
        { ...ana, busy: [{ startsAt: '2027-01-09T05:00:00Z', endsAt: '2027-01-09T05:30:00Z' }] },
        ben,
      ],
    });
    expect(
      plan.visits.map((v) => [v.cabinetTag, v.technicianIds, v.plannedStartAt, v.plannedEndAt]),
    ).toEqual([
      ['DR-A', ['t-ben'], '2027-01-09T05:00:00.000Z', '2027-01-09T06:00:00.000Z'],
      ['DR-B', ['t-ana'], '2027-01-09T05:30:00.000Z', '2027-01-09T06:00:00.000Z'],
    ]);
  });

  it('when a visit fits in the gap before a busy span, then it goes there; a longer one goes after it', () => {
    const busy = [{ startsAt: '2027-01-09T05:40:00Z', endsAt: '2027-01-09T06:00:00Z' }];
    const short = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-C', 5, 120, ['DC1'])],
      technicians: [{ ...ana, busy }],
    });
    expect(short.visits[0]!.plannedStartAt).toBe('2027-01-09T05:00:00.000Z');
    // 45 min (τ 240 s, wait 10) does not fit 05:00–05:40: it starts at 06:00Z
    const long = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-D', 10, 240, ['DC1'])],
      technicians: [{ ...ana, busy }],
    });
    expect([long.visits[0]!.plannedStartAt, long.visits[0]!.plannedEndAt]).toEqual([
      '2027-01-09T06:00:00.000Z',
      '2027-01-09T06:45:00.000Z',
    ]);
  });

  it('when the technician free soonest is free only after a visit they have, then the reason counts from its end', () => {
    // Ana is busy 06:00–07:40 local: free from 07:40, the 30 min bank would end 08:10
    const plan = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-F', 5, 120, ['DC1'])],
      technicians: [
        { ...ana, busy: [{ startsAt: '2027-01-09T05:00:00Z', endsAt: '2027-01-09T06:40:00Z' }] },
      ],
    });
    expect(plan.leftOut.map((b) => b.reason)).toEqual([
      'Needs about 30 min; Ana Brandt, free soonest (from 07:40), would finish at 08:10, after the window ends at 08:00 (Europe/Berlin).',
    ]);
  });

  it('when nobody has the time free between their visits, then the bank is left out saying so', () => {
    // Ana is busy 06:20–08:00 local: 20 min free, the bank needs 30
    const plan = proposeWindowPlan({
      occurrence,
      cabinets: [cabinet('DR-E', 5, 120, ['DC1'])],
      technicians: [
        { ...ana, busy: [{ startsAt: '2027-01-09T05:20:00Z', endsAt: '2027-01-09T07:00:00Z' }] },
      ],
    });
    expect(plan.visits).toEqual([]);
    expect(plan.leftOut.map((b) => b.reason)).toEqual([
      'Needs about 30 min; no technician has that long free before the window ends at 08:00 (Europe/Berlin).',
    ]);
  });
});

describe('packProposalRows', () => {
  it('when a proposal is packed as it is, then every row keeps its times', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    const packed = packProposalRows(plan.visits, occurrence);
    expect(packed.map((r) => [r.plannedStartAt, r.plannedEndAt, r.endsAfterWindow])).toEqual(
      plan.visits.map((v) => [v.plannedStartAt, v.plannedEndAt, false]),
    );
  });

  it('when a row is removed, then the technician’s later rows move up to close the gap', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    // without DR-101 (Ben 06:00–07:00), DR-105 starts at 06:00 local (05:00Z)
    const packed = packProposalRows(
      plan.visits.filter((v) => v.cabinetTag !== 'DR-101'),
      occurrence,
    );
    expect(packed.find((r) => r.cabinetTag === 'DR-105')!.plannedStartAt).toBe(
      '2027-01-09T05:00:00.000Z',
    );
  });

  it('when a row goes to another technician, then it follows that technician’s rows and may end after the window', () => {
    const plan = proposeWindowPlan({ occurrence, cabinets: handCase, technicians: [ana, ben] });
    // DR-105 (50 min) moved from Ben to Ana: Ana has DR-104 until 07:10 local, so DR-105 runs 07:10–08:00 and DR-102 (45) 08:00–08:45
    const rows = plan.visits.map((v) =>
      v.cabinetTag === 'DR-105' ? { ...v, technicianIds: ['t-ana'] } : v,
    );
    const packed = packProposalRows(rows, occurrence);
    const byTag = Object.fromEntries(packed.map((r) => [r.cabinetTag, r]));
    expect([
      byTag['DR-105']!.plannedStartAt,
      byTag['DR-105']!.plannedEndAt,
      byTag['DR-105']!.endsAfterWindow,
    ]).toEqual(['2027-01-09T06:10:00.000Z', '2027-01-09T07:00:00.000Z', false]);
    expect([byTag['DR-102']!.plannedStartAt, byTag['DR-102']!.endsAfterWindow]).toEqual([
      '2027-01-09T07:00:00.000Z',
      true,
    ]);
  });

  it('when a technician already has a visit, then a row laid out for them goes around it', () => {
    const packed = packProposalRows(
      [
        { technicianIds: ['a'], estimatedMinutes: 30 },
        { technicianIds: ['a'], estimatedMinutes: 30 },
      ],
      occurrence,
      { a: [{ startsAt: '2027-01-09T05:30:00Z', endsAt: '2027-01-09T06:00:00Z' }] },
    );
    expect(packed.map((r) => [r.plannedStartAt, r.endsAfterWindow])).toEqual([
      ['2027-01-09T05:00:00.000Z', false],
      ['2027-01-09T06:00:00.000Z', false],
    ]);
  });

  it('when a row has two technicians, then it starts when both are free and keeps both busy', () => {
    const packed = packProposalRows(
      [
        { technicianIds: ['a'], estimatedMinutes: 30 },
        { technicianIds: ['a', 'b'], estimatedMinutes: 20 },
        { technicianIds: ['b'], estimatedMinutes: 10 },
      ],
      occurrence,
    );
    expect(packed.map((r) => r.plannedStartAt)).toEqual([
      '2027-01-09T05:00:00.000Z',
      '2027-01-09T05:30:00.000Z',
      '2027-01-09T05:50:00.000Z',
    ]);
  });
});
