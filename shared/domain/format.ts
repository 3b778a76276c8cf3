/**
 * Number formatting for the engine's plain-words messages (not for display of results, which the
 * web formats itself). Locale-free, so messages are the same in the API, the browser and the CLI.
 */

/**
 * `value` rounded to `significant` digits, without exponent notation.
 *
 * @example
 * formatNumber(220.8934) // '221'
 * formatNumber(0.0123456, 3) // '0.0123'
 */
export function formatNumber(value: number, significant = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const rounded = Number(value.toPrecision(significant));
  if (Math.abs(rounded) >= 1e-6 && Math.abs(rounded) < 1e21) {
    const digits = Math.max(0, significant - 1 - Math.floor(Math.log10(Math.abs(rounded))));
    return rounded
      .toFixed(Math.min(digits, 20))
      .replace(/(\.\d*?)0+$/, '$1')
      .replace(/\.$/, '');
  }
  return String(rounded);
}

/** Volts with unit, e.g. `formatVolts(412.04)` → `'412 V'`. */
export function formatVolts(volts: number): string {
  return `${formatNumber(volts, 3)} V`;
}

/** Seconds with unit, e.g. `formatSeconds(220.93)` → `'221 s'`. */
export function formatSeconds(seconds: number): string {
  return `${formatNumber(seconds, 3)} s`;
}

/** Ohms with a prefix, e.g. `formatOhms(94_000)` → `'94 kΩ'`, `formatOhms(1e7)` → `'10 MΩ'`. */
export function formatOhms(ohms: number): string {
  if (Math.abs(ohms) >= 1e6) return `${formatNumber(ohms / 1e6, 3)} MΩ`;
  if (Math.abs(ohms) >= 1e3) return `${formatNumber(ohms / 1e3, 3)} kΩ`;
  return `${formatNumber(ohms, 3)} Ω`;
}

/** A fraction as a percentage, e.g. `formatPercent(0.0452)` → `'4.5 %'`. */
export function formatPercent(fraction: number, significant = 2): string {
  return `${formatNumber(fraction * 100, significant)} %`;
}
