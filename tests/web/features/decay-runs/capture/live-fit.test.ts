import { describe, expect, it } from 'vitest';
import { bankEngineInputs } from '../../../../../shared/domain/bank-engine-inputs';
import { captureScheduleSeconds } from '../../../../../shared/domain/capture-schedule';
import {
  liveFit,
  TRUSTWORTHY_FIT,
} from '../../../../../web/src/features/decay-runs/components/capture/live-fit';
import { bankJson } from '../bank-json';

const engine = bankEngineInputs(bankJson())!;
const TAU = 44_000 * 7050e-6; // 310.2 s, the nameplate τ of the bank
/** The readings a technician types at the prompts up to `untilSeconds`, one decimal as a meter shows. */
const readings = (untilSeconds: number, tau = TAU) =>
  captureScheduleSeconds(TAU)
    .filter((t) => t <= untilSeconds)
    .map((t) => ({ tSeconds: t, volts: Math.round(540 * Math.exp(-t / tau) * 10) / 10 }));

describe('liveFit', () => {
  it('when fewer than 3 readings are in, then there is no fit and it says how many more are needed', () => {
    const fit = liveFit(readings(10), engine);
    expect(fit.fit).toBeNull();
    expect(fit.verdict).toBeNull();
    expect(fit.trustworthy).toBe(false);
    expect(fit.waitingFor).toBe('1 more reading for a first fit');
  });

  it('when the readings span less than one τ, then the chart has a fit but the verdict waits for readings up to one τ', () => {
    const fit = liveFit(readings(120), engine);
    expect(fit.fit).not.toBeNull();
    expect(fit.fit!.spanTimeConstants).toBeLessThan(TRUSTWORTHY_FIT.minSpanTimeConstants);
    expect(fit.trustworthy).toBe(false);
    expect(fit.waitingFor).toMatch(/^readings up to about 5:1\d \(one time constant\)$/);
  });

  it('when the readings span more than one τ with a narrow interval, then the verdict is trustworthy and healthy', () => {
    const fit = liveFit(readings(1.2 * TAU), engine);
    expect(fit.trustworthy).toBe(true);
    expect(fit.waitingFor).toBeNull();
    expect(fit.verdict?.status).toBe('ok');
    expect(fit.verdict?.health).toBe('healthy');
    const [low, high] = fit.fit!.tauCi95;
    expect((high - low) / 2 / fit.fit!.tauSeconds).toBeLessThanOrEqual(
      TRUSTWORTHY_FIT.maxHalfWidth,
    );
  });

  it('when the bank’s figures are not at hand (offline), then the fit alone is drawn and τ is found', () => {
    const fit = liveFit(readings(1.2 * TAU), null);
    expect(fit.verdict).toBeNull();
    expect(fit.fit!.tauSeconds).toBeCloseTo(TAU, -1);
    expect(fit.trustworthy).toBe(true);
  });

  it('when a visual finding is noted, then the live verdict is end of life whatever τ says', () => {
    const fit = liveFit(readings(1.2 * TAU), engine, { visualFindings: ['bulged-can'] });
    expect(fit.verdict?.health).toBe('end-of-life');
    expect(fit.verdict?.safetyFinding).toBe(true);
  });

  it('when readings are typed out of order, then they are plotted in time order', () => {
    const typed = readings(60);
    const fit = liveFit([typed[3]!, ...typed.slice(0, 3), ...typed.slice(4)], engine);
    expect(fit.plotted.map((s) => s.tSeconds)).toEqual(typed.map((s) => s.tSeconds));
  });
});
