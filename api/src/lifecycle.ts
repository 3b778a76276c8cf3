/**
 * Whether this process has begun to stop. From that moment readiness (`GET /api/health`) answers
 * 503, so whatever watches it (a load balancer, a person, a test) sends no new work here.
 */
let stopping = false;

/** Called once when a stop begins (api/src/server.ts). */
export function markStopping(): void {
  stopping = true;
}

export function isStopping(): boolean {
  return stopping;
}
