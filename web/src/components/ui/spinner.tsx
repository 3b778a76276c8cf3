export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 text-tide-600">
      <span className="h-5 w-5 animate-spin rounded-full border-2 border-tide-200 border-t-tide-600" />
      <span className="text-sm">{label}</span>
    </div>
  );
}
