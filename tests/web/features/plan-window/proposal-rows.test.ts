import { describe, expect, it } from 'vitest';
import type { WindowProposal } from '../../../../shared/schemas/plan-window';
import {
  batchBody,
  canConfirm,
  layOutRows,
  overridesForWarnings,
  reassignRow,
  removeRow,
  rowsByTechnician,
  rowsFromProposal,
  rowWarningsOf,
} from '../../../../web/src/features/plan-window/utils/proposal-rows';
import { occurrenceChoices } from '../../../../web/src/features/plan-window/utils/occurrences';
import {
  minutesText,
  zonedRangeText,
  zonedTimesText,
} from '../../../../web/src/features/plan-window/utils/zoned-text';

// the hand-computed case of tests/shared/domain/plan-window.test.ts, as the API answers it
const window = {
  id: 'w1',
  title: 'Saturday stop',
  areaId: 'a1',
  areaName: 'Press hall',
  siteId: 's1',
  siteName: 'Elbe Works',
  timeZone: 'Europe/Berlin',
  startsAt: '2027-01-09T05:00:00.000Z',
  endsAt: '2027-01-09T07:00:00.000Z',
};
const ana = { id: 't-ana', name: 'Ana Brandt', busy: [] };
const ben = { id: 't-ben', name: 'Ben Okafor', busy: [] };
const visit = (
  tag: string,
  technician: { id: string; name: string },
  startsAt: string,
  endsAt: string,
  minutes: number,
) => ({
  cabinetId: `c-${tag}`,
  cabinetTag: tag,
  markedWaitMinutes: 5,
  bankIds: [`b-${tag}`],
  banks: [
    {
      id: `b-${tag}`,
      position: 'DC1',
      baselineTauSeconds: 120,
      dueOn: '2021-01-14',
      estimatedMinutes: minutes,
    },
  ],
  technicianIds: [technician.id],
  technicians: [technician],
  plannedStartAt: startsAt,
  plannedEndAt: endsAt,
  notes: 'Shutdown window: Saturday stop',
  estimatedMinutes: minutes,
});
const proposal: WindowProposal = {
  window,
  dueBy: '2027-01-09',
  visits: [
    visit('DR-104', ana, '2027-01-09T05:00:00.000Z', '2027-01-09T06:10:00.000Z', 70),
    visit('DR-101', ben, '2027-01-09T05:00:00.000Z', '2027-01-09T06:00:00.000Z', 60),
    visit('DR-105', ben, '2027-01-09T06:00:00.000Z', '2027-01-09T06:50:00.000Z', 50),
    visit('DR-102', ana, '2027-01-09T06:10:00.000Z', '2027-01-09T06:55:00.000Z', 45),
  ],
  leftOut: [],
  technicians: [ana, ben],
  technicianPool: 'site',
  busyTechnicians: [],
};

describe('the rows of a proposal', () => {
  it('when a proposal is laid out untouched, then its times stay and it can be confirmed', () => {
    const rows = layOutRows(rowsFromProposal(proposal), window);
    expect(rows.map((r) => [r.visit.cabinetTag, r.plannedStartAt, r.plannedEndAt])).toEqual(
      proposal.visits.map((v) => [v.cabinetTag, v.plannedStartAt, v.plannedEndAt]),
    );
    expect(canConfirm(rows)).toBe(true);
  });

  it('when a row is removed, then the technician’s next row starts earlier', () => {
    const rows = layOutRows(removeRow(rowsFromProposal(proposal), 'c-DR-101'), window);
    expect(rows.find((r) => r.visit.cabinetTag === 'DR-105')!.plannedStartAt).toBe(
      '2027-01-09T05:00:00.000Z',
    );
  });

  it('when a row goes to a technician with no time left, then it passes the window’s end and the plan cannot be confirmed', () => {
    // DR-101 (60) after Ana's DR-104 (until 07:10 local) and DR-102 (until 07:55): 07:55–08:55
    const rows = layOutRows(reassignRow(rowsFromProposal(proposal), 'c-DR-101', 't-ana'), window);
    const moved = rows.find((r) => r.visit.cabinetTag === 'DR-101')!;
    expect([moved.technicianIds, moved.plannedStartAt, moved.endsAfterWindow]).toEqual([
      ['t-ana'],
      '2027-01-09T06:55:00.000Z',
      true,
    ]);
    expect(canConfirm(rows)).toBe(false);
  });

  it('when rows are grouped by technician, then each group holds its rows by start and their minutes', () => {
    const groups = rowsByTechnician(
      layOutRows(rowsFromProposal(proposal), window),
      proposal.technicians,
    );
    expect(
      groups.map((g) => [g.name, g.rows.map((r) => r.visit.cabinetTag), g.plannedMinutes]),
    ).toEqual([
      ['Ana Brandt', ['DR-104', 'DR-102'], 115],
      ['Ben Okafor', ['DR-101', 'DR-105'], 110],
    ]);
  });

  it('when a row goes to a technician with a visit already planned, then it is laid out around that visit', () => {
    const busyBen = {
      ...ben,
      busy: [
        {
          startsAt: '2027-01-09T06:00:00.000Z',
          endsAt: '2027-01-09T06:10:00.000Z',
          cabinetTag: 'DR-7',
        },
      ],
    };
    // Ben: DR-101 05:00–06:00Z, then DR-105 (50) cannot start before his DR-7 ends at 06:10Z
    const rows = layOutRows(rowsFromProposal(proposal), window, [ana, busyBen]);
    const dr105 = rows.find((r) => r.visit.cabinetTag === 'DR-105')!;
    expect([dr105.plannedStartAt, dr105.plannedEndAt, dr105.endsAfterWindow]).toEqual([
      '2027-01-09T06:10:00.000Z',
      '2027-01-09T07:00:00.000Z',
      false,
    ]);
  });

  it('when every row is removed, then nothing can be confirmed', () => {
    const rows = proposal.visits.reduce(
      (left, v) => removeRow(left, v.cabinetId),
      rowsFromProposal(proposal),
    );
    expect(canConfirm(layOutRows(rows, window))).toBe(false);
  });

  it('when the batch body is made, then it carries the laid-out times and the overrides of each row', () => {
    const rows = layOutRows(removeRow(rowsFromProposal(proposal), 'c-DR-101'), window);
    const body = batchBody(
      rows,
      new Map([[1, [{ kind: 'not-due' as const, reason: 'Same stop' }]]]),
    );
    expect(body.visits[1]).toEqual({
      cabinetId: 'c-DR-105',
      bankIds: ['b-DR-105'],
      plannedStartAt: '2027-01-09T05:00:00.000Z',
      plannedEndAt: '2027-01-09T05:50:00.000Z',
      technicianIds: ['t-ben'],
      notes: 'Shutdown window: Saturday stop',
      overrides: [{ kind: 'not-due', reason: 'Same stop' }],
    });
    expect(body.visits[0]!.overrides).toEqual([]);
  });
});

describe('warnings of a refused batch', () => {
  it('when the server names rows’ overrides, then each warning is tied to its row and one reason accepts them all', () => {
    const warnings = rowWarningsOf([
      { path: 'visits.2.overrides', kind: 'double-booked', message: 'Ben Okafor has DR-7 then.' },
      {
        path: 'visits.2.overrides',
        kind: 'not-due',
        message: 'Bank DC1 is not due until 2027-03-01.',
      },
      {
        path: 'visits.0.technicianIds',
        message: 'Choose active people who hold the technician role.',
      },
    ]);
    expect(warnings.map((w) => [w.index, w.kind])).toEqual([
      [2, 'double-booked'],
      [2, 'not-due'],
    ]);
    expect(overridesForWarnings(warnings, '  agreed with Ben  ').get(2)).toEqual([
      { kind: 'double-booked', reason: 'agreed with Ben' },
      { kind: 'not-due', reason: 'agreed with Ben' },
    ]);
  });
});

describe('occurrences to pick', () => {
  it('when windows have occurrences, then they are listed soonest first and those over are left out', () => {
    const windows = [
      {
        ...window,
        recurrence: null,
        recurrenceText: 'once',
        notes: '',
        version: 1,
        retiredAt: null,
        createdAt: '',
        updatedAt: '',
        occurrences: [
          { startsAt: '2027-01-02T05:00:00.000Z', endsAt: '2027-01-02T07:00:00.000Z' },
          { startsAt: '2027-01-09T05:00:00.000Z', endsAt: '2027-01-09T07:00:00.000Z' },
        ],
      },
      {
        ...window,
        id: 'w2',
        title: 'Night stop',
        recurrence: null,
        recurrenceText: 'once',
        notes: '',
        version: 1,
        retiredAt: null,
        createdAt: '',
        updatedAt: '',
        occurrences: [{ startsAt: '2027-01-05T21:00:00.000Z', endsAt: '2027-01-06T03:00:00.000Z' }],
      },
    ];
    const choices = occurrenceChoices(windows, '2027-01-03T00:00:00.000Z');
    expect(choices.map((c) => [c.title, c.startsAt])).toEqual([
      ['Night stop', '2027-01-05T21:00:00.000Z'],
      ['Saturday stop', '2027-01-09T05:00:00.000Z'],
    ]);
    expect(occurrenceChoices(windows, '2027-01-03T00:00:00.000Z', 'w1').map((c) => c.key)).toEqual([
      'w1|2027-01-09T05:00:00.000Z',
    ]);
  });
});

describe('times and durations in words', () => {
  it('when a range is shown, then it is on the site’s clock with the zone named', () => {
    expect(zonedRangeText(window.startsAt, window.endsAt, 'Europe/Berlin')).toBe(
      'Sat 9 Jan 2027, 06:00–08:00 Europe/Berlin',
    );
    expect(zonedRangeText('2027-01-05T21:00:00Z', '2027-01-06T03:00:00Z', 'Europe/Berlin')).toBe(
      'Tue 5 Jan 2027, 22:00–Wed 6 Jan, 04:00 Europe/Berlin',
    );
    expect(zonedTimesText(window.startsAt, '2027-01-09T06:10:00Z', 'Europe/Berlin')).toBe(
      '06:00–07:10',
    );
  });

  it('when minutes are shown, then as hours and minutes', () => {
    expect([minutesText(45), minutesText(60), minutesText(70), minutesText(120)]).toEqual([
      '45 min',
      '1 h',
      '1 h 10 min',
      '2 h',
    ]);
  });
});
