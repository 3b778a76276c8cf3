import { useState } from 'react';
import { ROLE_LABELS } from '../../../../shared/constants/roles';
import type { IssuedApiToken } from '../../../../shared/schemas/api-token';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { ApiTokenForm } from '../../features/api-tokens/components/api-token-form';
import { ApiTokenList } from '../../features/api-tokens/components/api-token-list';
import { IssuedToken } from '../../features/api-tokens/components/issued-token';
import { CalendarFeedSection } from '../../features/calendar-feed/components/calendar-feed-section';
import { useMe } from '../../features/auth/api/get-me';

/** The signed-in person's profile: who they are to Ebbline, their API tokens and their calendar feed. */
export function Component() {
  const me = useMe();
  const [issued, setIssued] = useState<IssuedApiToken | null>(null);
  if (!me.data) return null;
  return (
    <div>
      <PageHeader
        title="Your profile"
        lead="Your name and e-mail come from the company’s sign-in service; your roles from Ebbline’s admins."
      />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]">
        <Card title="You">
          <dl className="grid grid-cols-[6rem_minmax(0,1fr)] gap-y-2 text-sm">
            <dt className="text-tide-600">Name</dt>
            <dd className="font-medium text-tide-900">{me.data.name}</dd>
            <dt className="text-tide-600">E-mail</dt>
            <dd className="break-all font-medium text-tide-900">{me.data.email}</dd>
            <dt className="text-tide-600">Roles</dt>
            <dd className="font-medium text-tide-900">
              {me.data.roles.map((r) => ROLE_LABELS[r]).join(', ')}
            </dd>
          </dl>
        </Card>
        {/* before the tokens: a technician on a phone comes here for the calendar, rarely for a token */}
        <Card title="Your visits in your calendar">
          <CalendarFeedSection />
        </Card>
        <Card title="API tokens">
          <p className="mb-4 text-sm leading-relaxed text-tide-800">
            For scripts and logger gateways that send readings to Ebbline. A token acts for you,
            never with more rights than you hold at the time it is used, and only until it expires
            or you revoke it.
          </p>
          <div className="space-y-5">
            {issued ? <IssuedToken token={issued} onDone={() => setIssued(null)} /> : null}
            <ApiTokenForm myRoles={me.data.roles} onIssued={setIssued} />
            <div className="border-t border-tide-100 pt-4">
              <h3 className="mb-1 text-sm font-bold text-tide-800">Your tokens</h3>
              <ApiTokenList />
            </div>
          </div>
        </Card>
      </div>
    </div>
  );
}
