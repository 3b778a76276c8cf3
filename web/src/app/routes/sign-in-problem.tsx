import { useSearchParams } from 'react-router';
import { CenteredPage } from '../../components/layout/centered-page';

/** What each refusal at /auth/callback means for the person, and what to do. */
const PROBLEMS: Record<string, { title: string; text: string }> = {
  'state-mismatch': {
    title: 'This sign-in could not be matched',
    text: 'The answer from the sign-in service did not belong to a sign-in started in this browser, so Ebbline refused it. This happens after using the back button or an old link.',
  },
  expired: {
    title: 'The sign-in took too long',
    text: 'A sign-in must be completed within a few minutes of starting it. Start again.',
  },
  'provider-error': {
    title: 'The sign-in service did not sign you in',
    text: 'The sign-in was cancelled or refused at the sign-in service.',
  },
  rejected: {
    title: 'The sign-in service’s answer did not pass Ebbline’s checks',
    text: 'Ebbline checks every answer (its signature, who issued it, for whom and until when). This one failed, so nobody was signed in. If it keeps happening, tell your admin.',
  },
  deactivated: {
    title: 'Your Ebbline account is deactivated',
    text: 'An admin has switched off your access. Ask an admin if you need it again.',
  },
  'email-taken': {
    title: 'Your e-mail address belongs to another Ebbline account',
    text: 'Ask an admin to sort out the two accounts.',
  },
  unreachable: {
    title: 'The sign-in service cannot be reached',
    text: 'Ebbline could not reach the company’s sign-in service. Try again in a minute; if it persists, tell your admin.',
  },
};

/** Where /auth/callback sends a sign-in it refused: says why, offers to start again. */
export function Component() {
  const [params] = useSearchParams();
  const problem = PROBLEMS[params.get('reason') ?? ''] ?? {
    title: 'The sign-in did not complete',
    text: 'Start again.',
  };
  return (
    <CenteredPage>
      <div role="alert" data-testid="sign-in-problem">
        <p className="text-sm font-bold uppercase tracking-wide text-eol-600">Not signed in</p>
        <h1 className="mt-1 text-2xl font-bold tracking-tight text-tide-900">{problem.title}</h1>
        <p className="mt-2 text-tide-800">{problem.text}</p>
        <a
          href="/auth/login"
          className="mt-6 block rounded-lg bg-spark-400 px-4 py-2.5 text-center font-bold text-tide-950 hover:bg-spark-300"
        >
          Sign in again
        </a>
      </div>
    </CenteredPage>
  );
}
