import { formatFigure } from '../../../../../shared/domain';

/**
 * Seconds to three significant figures, with minutes alongside from 2 min.
 *
 * @example
 * seconds(376.4) // '376 s (6.3 min)'
 */
export function seconds(value: number): string {
  return value >= 120 ? `${formatFigure(value)} s (${formatFigure(value / 60, 2)} min)` : `${formatFigure(value)} s`;
}

/**
 * Microfarads to three significant figures.
 *
 * @example
 * microfarads(1522.4) // '1,520 µF'
 */
export function microfarads(value: number): string {
  return `${formatFigure(value)} µF`;
}

/**
 * Ohms to three significant figures with a prefix.
 *
 * @example
 * ohms(147_783) // '148 kΩ'
 */
export function ohms(value: number): string {
  if (value >= 1e6) return `${formatFigure(value / 1e6)} MΩ`;
  if (value >= 1e3) return `${formatFigure(value / 1e3)} kΩ`;
  return `${formatFigure(value)} Ω`;
}

/** Today as an ISO date in the browser's own calendar (the date of the next check counts from it). */
export function todayOn(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}
