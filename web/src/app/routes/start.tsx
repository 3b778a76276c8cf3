import { Navigate } from 'react-router';
import { useMe } from '../../features/auth/api/get-me';
import { startScreenFor } from '../access';

/** `/`: each role lands on its own start screen (the shell has already loaded who is signed in). */
export function Component() {
  const me = useMe();
  return me.data ? <Navigate to={startScreenFor(me.data.roles)} replace /> : null;
}
