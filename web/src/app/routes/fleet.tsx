import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { Spinner } from '../../components/ui/spinner';
import { ErrorPanel } from '../../components/ui/error-panel';
import { useHealth } from '../../features/health/api/get-health';

export function Component() {
  const health = useHealth();
  return (
    <div>
      <PageHeader
        title="Fleet"
        lead="The health of every DC-link capacitor bank, judged from its discharge decay against its τ baseline."
      />
      <div className="grid gap-4 md:grid-cols-2">
        <Card title="Server">
          {health.isPending ? (
            <Spinner label="Asking the server…" />
          ) : health.isError ? (
            <ErrorPanel title="The server did not answer">{health.error.message}</ErrorPanel>
          ) : (
            <dl className="grid grid-cols-2 gap-y-2 text-sm" data-testid="fleet-health">
              <dt className="text-tide-600">Status</dt>
              <dd className="font-medium" data-testid="health-status">{health.data.status}</dd>
              <dt className="text-tide-600">Database</dt>
              <dd className="font-medium">{health.data.database}</dd>
              <dt className="text-tide-600">Version</dt>
              <dd className="font-medium" data-testid="health-version">{health.data.version}</dd>
              <dt className="text-tide-600">Up for</dt>
              <dd className="font-medium">{health.data.uptimeSeconds} s</dd>
            </dl>
          )}
        </Card>
        <Card title="How Ebbline judges a bank">
          <p className="text-sm leading-relaxed text-tide-800">
            After isolation the DC bus decays through its bleeder as V(t) = V₀·e<sup>−t/τ</sup>, with τ = R·C.
            Ebbline fits τ from the readings, turns it into capacitance and compares it with the bank’s
            baseline: <strong>healthy</strong>, <strong>watch</strong> or <strong>end of life</strong>.
          </p>
        </Card>
      </div>
    </div>
  );
}
