import { useSearchParams } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';
import { useMe } from '../../features/auth/api/get-me';
import { PeopleList } from '../../features/people/components/people-list';
import { SignInLog } from '../../features/people/components/sign-in-log';

const TABS = [
  { id: 'people', label: 'People' },
  { id: 'sign-in-log', label: 'Sign-in log' },
] as const;

/** People (admins): who may use Ebbline in which roles, and the sign-in log. */
export function Component() {
  const me = useMe();
  const [params, setParams] = useSearchParams();
  const tab = params.get('tab') === 'sign-in-log' ? 'sign-in-log' : 'people';
  return (
    <div>
      <PageHeader
        title="People"
        lead="Who may use Ebbline, and in which roles. A person’s first sign-in brings the roles the company directory gives them; after that, roles are set here."
      />
      <div role="tablist" aria-label="People" className="mb-5 flex gap-1 border-b border-tide-100">
        {TABS.map((t) => (
          <button
            key={t.id}
            role="tab"
            type="button"
            aria-selected={tab === t.id}
            onClick={() => setParams(t.id === 'people' ? {} : { tab: t.id }, { replace: true })}
            className={`-mb-px border-b-2 px-4 py-2 text-sm font-medium transition ${
              tab === t.id
                ? 'border-spark-400 text-tide-900'
                : 'border-transparent text-tide-600 hover:text-tide-900'
            }`}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div role="tabpanel">
        {tab === 'people' ? <PeopleList myId={me.data?.id ?? ''} /> : <SignInLog />}
      </div>
    </div>
  );
}
