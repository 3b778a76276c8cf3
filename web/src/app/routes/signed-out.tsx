import { CenteredPage } from '../../components/layout/centered-page';

/** Where the provider sends people after signing out. */
export function Component() {
  return (
    <CenteredPage>
      <div data-testid="signed-out">
        <h1 className="text-2xl font-bold tracking-tight text-tide-900">You have signed out</h1>
        <p className="mt-2 text-tide-800">
          Your Ebbline session has ended, and so has your sign-in at the company’s sign-in service
          on this device.
        </p>
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
