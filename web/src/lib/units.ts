/** How quantities read on screen: units with a thin space, sensible precision, en-GB grouping. */

const number = (value: number, digits: number) =>
  value.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 });

/** 7050 → "7,050 µF"; 0.82 → "0.82 µF". Always µF, the unit nameplates and meters use. */
export function formatMicrofarads(value: number | null | undefined): string {
  if (value == null) return '';
  return `${number(value, value < 10 ? 2 : 0)} µF`;
}

/** Seconds with one decimal below 100 s, whole seconds above, and minutes alongside from 2 min. */
export function formatSeconds(value: number | null | undefined): string {
  if (value == null) return '';
  const s = `${number(value, value < 100 ? 1 : 0)} s`;
  return value >= 120 ? `${s} (${number(value / 60, 1)} min)` : s;
}

export function formatVolts(value: number | null | undefined): string {
  return value == null ? '' : `${number(value, 0)} V`;
}

/** 47 000 → "47 kΩ"; 1 200 000 → "1.2 MΩ". */
export function formatOhms(value: number | null | undefined): string {
  if (value == null) return '';
  if (value >= 1e6) return `${number(value / 1e6, 2)} MΩ`;
  if (value >= 1e3) return `${number(value / 1e3, 1)} kΩ`;
  return `${number(value, 0)} Ω`;
}

/** 0.9 → "90 %". */
export function formatRatio(value: number | null | undefined): string {
  return value == null ? '' : `${number(value * 100, 1)} %`;
}

export function formatKilowatts(value: number | null | undefined): string {
  return value == null ? '' : `${number(value, 1)} kW`;
}

/** "2024-03-01" → "1 Mar 2024" (a calendar date: no time zone shift). */
export function formatCalendarDate(value: string | null | undefined): string {
  if (!value) return '';
  const [y, m, d] = value.split('-').map(Number);
  return new Date(Date.UTC(y!, m! - 1, d!)).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
}
