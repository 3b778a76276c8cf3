import type { ReactNode } from 'react';

const TONES = {
  tide: 'bg-tide-100 text-tide-800',
  spark: 'bg-spark-300/60 text-tide-950',
  muted: 'bg-tide-50 text-tide-600 ring-1 ring-tide-100',
  warn: 'bg-watch-600/10 text-watch-600',
  danger: 'bg-eol-600/10 text-eol-600',
  ok: 'bg-ok-600/10 text-ok-600',
} as const;

/** A short label in a pill; the word carries the meaning, the colour only helps. */
export function Badge({
  tone = 'tide',
  children,
}: {
  tone?: keyof typeof TONES;
  children: ReactNode;
}) {
  return (
    <span
      className={`inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium ${TONES[tone]}`}
    >
      {children}
    </span>
  );
}
