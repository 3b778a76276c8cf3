import { useHealth } from '../api/get-health';

/** The server's health and version, live from GET /api/health. */
export function ServerStatus({ compact = false }: { compact?: boolean }) {
  const health = useHealth();
  if (health.isPending) {
    return <span className="text-sm text-tide-200" data-testid="server-status">checking server…</span>;
  }
  if (health.isError) {
    return (
      <span className="text-sm text-spark-300" data-testid="server-status" role="alert">
        server unreachable
      </span>
    );
  }
  const ok = health.data.status === 'ok';
  return (
    <span
      data-testid="server-status"
      data-status={health.data.status}
      className={`inline-flex items-center gap-2 text-sm ${compact ? 'text-tide-100' : 'text-tide-900'}`}
    >
      <span className={`h-2.5 w-2.5 rounded-full ${ok ? 'bg-tide-400' : 'bg-spark-400'}`} aria-hidden="true" />
      {ok ? 'server ok' : health.data.status === 'stopping' ? 'server stopping' : 'database down'} · v{health.data.version}
    </span>
  );
}
