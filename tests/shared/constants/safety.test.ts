import { describe, expect, it } from 'vitest';
import {
  DISCHARGE_CAUTION,
  DISCHARGE_CAUTION_TEXT,
  DISCHARGE_THRESHOLDS_VOLTS,
} from '../../../shared/constants/safety';

describe('the discharge caution', () => {
  const text = DISCHARGE_CAUTION_TEXT.toLowerCase();

  it('when shown, then it limits the work to qualified persons and asks for lockout/tagout', () => {
    expect(text).toContain('qualified persons');
    expect(text).toContain('lockout/tagout');
  });

  it('when shown, then it asks to verify absence of voltage with a rated meter, test-verify-test', () => {
    expect(text).toContain('absence of voltage');
    expect(text).toContain('rated meter');
    expect(text).toContain('test-verify-test');
  });

  it("when shown, then it defers to the maker's marked wait time, a meter reading, local codes and licensed practice", () => {
    expect(text).toContain('marked wait time');
    expect(text).toMatch(/never replaces the drive maker's marked wait time or a meter reading/);
    expect(text).toContain('local codes and licensed practice');
  });

  it('when the plain text is built, then it holds every line of the caution', () => {
    for (const line of DISCHARGE_CAUTION.lines) expect(DISCHARGE_CAUTION_TEXT).toContain(line);
    expect(DISCHARGE_THRESHOLDS_VOLTS).toEqual([60, 50]);
  });
});
