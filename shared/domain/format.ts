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

/** Decimals a figure shows when rounded to `significant` figures: 0 for 1,520, 2 for 1.52. */
function decimalsAtSignificant(value: number, significant: number): number {
  if (!Number.isFinite(value) || value === 0) return Math.max(0, significant - 1);
  const rounded = Number(Math.abs(value).toPrecision(significant));
  return Math.min(20, Math.max(0, significant - 1 - Math.floor(Math.log10(rounded))));
}

/** `value` rounded to `significant` figures, with `decimals` decimals and thousands grouped with commas. */
function fixedGrouped(value: number, decimals: number, significant: number): string {
  const fixed = Math.abs(Number(value.toPrecision(significant))).toFixed(decimals);
  const [whole, fraction] = fixed.split('.');
  const grouped = whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  const sign = value < 0 && Number(fixed) !== 0 ? '−' : '';
  return `${sign}${grouped}${fraction !== undefined ? `.${fraction}` : ''}`;
}

/**
 * A figure for people to read: `significant` figures (three by default, as the engine's
 * precision warrants), thousands grouped with commas, a true minus sign, no trailing zeros.
 * Locale-free.
 *
 * @example
 * formatFigure(1522.38) // '1,520'
 * formatFigure(101.6654) // '102'
 * formatFigure(45.27) // '45.3'
 * formatFigure(0.012345) // '0.0123'
 */
export function formatFigure(value: number, significant = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  return fixedGrouped(value, decimalsAtSignificant(value, significant), significant)
    .replace(/(\.\d*?)0+$/, '$1')
    .replace(/\.$/, '');
}

/**
 * A 95 % (or any) interval at the precision of the figure it belongs to: both ends with the
 * decimals that `like` (the estimate) shows at `significant` figures, so the interval reads
 * alike its figure; the unit once, at the end. When both ends round to the same figure, the
 * interval is narrower than the last digit shown, and says so beside that one figure.
 *
 * @param low - lower end, in the unit shown
 * @param high - upper end, in the unit shown
 * @param options.like - the estimate the interval belongs to (default: the larger end)
 * @param options.unit - unit after the upper end, e.g. 's', '%', 'µF'
 * @example
 * formatInterval(98.43, 103.21, { like: 100.8, unit: '%' }) // '98 to 103 %'
 * formatInterval(224.983, 225.03, { like: 225.0, unit: 's' }) // '225 s (narrower than 1 s)'
 * formatInterval(1488.2, 1561.7, { like: 1522.4, unit: 'µF' }) // '1,490 to 1,560 µF'
 */
export function formatInterval(
  low: number,
  high: number,
  options: { like?: number; unit?: string; significant?: number } = {},
): string {
  const { unit, significant = 3 } = options;
  const like = options.like ?? Math.max(Math.abs(low), Math.abs(high));
  // the ends are rounded at the place of the estimate's last significant figure (tens for 1,520)
  const likeRounded = Math.abs(Number(like.toPrecision(significant))) || 1;
  const place = Math.floor(Math.log10(likeRounded)) - (significant - 1);
  const decimals = Math.max(0, -place);
  const step = 10 ** place;
  const end = (value: number) =>
    fixedGrouped(Number((Math.round(value / step) * step).toFixed(decimals)), decimals, 21);
  let [lowText, highText] = [end(Math.min(low, high)), end(Math.max(low, high))];
  if (/\.0+$/.test(lowText) && /\.0+$/.test(highText))
    [lowText, highText] = [lowText.replace(/\.0+$/, ''), highText.replace(/\.0+$/, '')];
  const withUnit = (text: string) => (unit ? `${text} ${unit}` : text);
  if (lowText === highText) {
    const stepText = fixedGrouped(step, decimals, 21);
    return `${withUnit(lowText)} (narrower than ${withUnit(stepText)})`;
  }
  return withUnit(`${lowText} to ${highText}`);
}

/**
 * A fraction as a percentage to three significant figures.
 *
 * @example
 * formatPercentFigure(1.016654) // '102 %'
 * formatPercentFigure(0.9134) // '91.3 %'
 */
export function formatPercentFigure(fraction: number, significant = 3): string {
  return `${formatFigure(fraction * 100, significant)} %`;
}

const MONTHS = [
  'Jan',
  'Feb',
  'Mar',
  'Apr',
  'May',
  'Jun',
  'Jul',
  'Aug',
  'Sep',
  'Oct',
  'Nov',
  'Dec',
] as const;

/**
 * An ISO calendar date as people write it on a plan, locale-free.
 *
 * @example
 * formatDateOn('2027-03-05') // '5 Mar 2027'
 */
export function formatDateOn(dateOn: string): string {
  const [year, month, day] = dateOn.slice(0, 10).split('-').map(Number);
  return `${day} ${MONTHS[month! - 1]} ${year}`;
}
