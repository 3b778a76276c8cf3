import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { useLocation } from 'react-router';
import { AppShell } from '../../components/layout/app-shell';
import { CenteredPage } from '../../components/layout/centered-page';
import { ErrorPanel } from '../../components/ui/error-panel';
import { Spinner } from '../../components/ui/spinner';
import { useMe } from '../../features/auth/api/get-me';
import { AccountMenu } from '../../features/auth/components/account-menu';
import { NotAllowed } from '../../features/auth/components/not-allowed';
import { WaitingForAccess } from '../../features/auth/components/waiting-for-access';
import { ServerStatus } from '../../features/health/components/server-status';
import { ConnectionNote, DraftSync, useOnline } from '../../features/decay-runs/drafts/draft-sync';
import { myVisitKeys } from '../../features/my-visits/api/get-my-visits';
import { visitKeys } from '../../features/planner/api/visits';
import { OfflineDrafts } from '../../features/decay-runs/drafts/offline-drafts';
import { ApiError } from '../../lib/api-client';
import { goToSignIn } from '../../lib/sign-in';
import { mayOpen, navFor, screenFor, startScreenFor } from '../access';

/**
 * The signed-in frame: asks the server who is signed in (GET /api/me), sends everyone else
 * to sign in, shows a person without a role whom to ask, and shows each role only its
 * screens; a direct link to another screen shows "not allowed".
 */
export function RootLayout() {
  const me = useMe();
  const queryClient = useQueryClient();
  const location = useLocation();
  const signedOut = me.error instanceof ApiError && me.error.status === 401;
  const online = useOnline();
  // the connection is back after opening offline: ask who is signed in again at once
  const { refetch } = me;
  const missingMe = !me.data;
  const wasOnline = useRef(online);
  useEffect(() => {
    if (online && !wasOnline.current && missingMe) void refetch();
    wasOnline.current = online;
  }, [online, missingMe, refetch]);
  // a phone can say it is online while nothing gets through: ask again every few seconds
  const unreachable = missingMe && me.error instanceof ApiError && me.error.status === 0;
  useEffect(() => {
    if (!unreachable) return;
    const timer = setInterval(() => void refetch(), 5_000);
    return () => clearInterval(timer);
  }, [unreachable, refetch]);
  useEffect(() => {
    if (signedOut) goToSignIn(location.pathname + location.search);
  }, [signedOut, location.pathname, location.search]);

  // opened without a connection (the service worker served the app): nobody can be signed in,
  // but the decay runs kept on this phone are shown, and they go once the connection returns
  if (missingMe && (!online || unreachable)) {
    return (
      <CenteredPage>
        <div className="space-y-4">
          <ConnectionNote unreachable />
          <OfflineDrafts />
        </div>
      </CenteredPage>
    );
  }
  if (me.isPending || signedOut) {
    return (
      <CenteredPage>
        <Spinner label={signedOut ? 'Taking you to sign in…' : 'Checking your sign-in…'} />
      </CenteredPage>
    );
  }
  if (me.isError) {
    return (
      <CenteredPage>
        {/* a 503 (database away, a restart) passes: the query asks again by itself */}
        <ErrorPanel title={me.error instanceof ApiError && me.error.status === 503 ? 'Ebbline is unavailable for a moment' : 'Ebbline could not check your sign-in'}>
          {me.error.message}
        </ErrorPanel>
      </CenteredPage>
    );
  }
  const { roles } = me.data;
  if (roles.length === 0) return <WaitingForAccess me={me.data} />;

  const screen = screenFor(location.pathname);
  return (
    <AppShell
      nav={navFor(roles)}
      status={<ServerStatus compact />}
      account={(closeMenu) => <AccountMenu me={me.data} onNavigate={closeMenu} />}
      notice={
        <>
          <DraftSync
            userId={me.data.id}
            // a stored run changes its visit (runs counted, a planned visit started)
            onSent={() => {
              void queryClient.invalidateQueries({ queryKey: myVisitKeys.all });
              void queryClient.invalidateQueries({ queryKey: visitKeys.all });
            }}
          />
          <ConnectionNote />
        </>
      }
    >
      {screen && !mayOpen(location.pathname, roles) ? (
        <NotAllowed
          screen={screen.label}
          allowedRoles={screen.roles}
          myRoles={roles}
          home={startScreenFor(roles)}
        />
      ) : undefined}
    </AppShell>
  );
}
