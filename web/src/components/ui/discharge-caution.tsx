import { DISCHARGE_CAUTION } from '../../../../shared/constants/safety';

/**
 * The caution that goes with everything Ebbline says about a cabinet's discharge
 * (shared/constants/safety.ts). `compact` shows the first line and folds the rest.
 */
export function DischargeCaution({ compact = false }: { compact?: boolean }) {
  const [first, ...rest] = DISCHARGE_CAUTION.lines;
  return (
    <aside
      role="note"
      aria-label="Discharge caution"
      data-testid="discharge-caution"
      className="rounded-lg border border-spark-400/60 bg-spark-300/25 px-3 py-2 text-sm text-tide-900"
    >
      <p className="font-bold">⚠ {DISCHARGE_CAUTION.title}</p>
      {compact ? (
        <details className="mt-1">
          <summary className="cursor-pointer">{first}</summary>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {rest.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </details>
      ) : (
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {DISCHARGE_CAUTION.lines.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      )}
    </aside>
  );
}
