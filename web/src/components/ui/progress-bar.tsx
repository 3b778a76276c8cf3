/** A determinate progress bar with its percentage, for uploads. */
export function ProgressBar({ fraction, label }: { fraction: number; label: string }) {
  const percent = Math.round(Math.min(1, Math.max(0, fraction)) * 100);
  return (
    <div>
      <div className="mb-1 flex justify-between text-sm text-tide-800">
        <span>{label}</span>
        <span>{percent} %</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-2.5 overflow-hidden rounded-full bg-tide-100"
      >
        <div className="h-full rounded-full bg-tide-600 transition-[width] duration-150" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}
