import { DueScreen } from '../../features/due/components/due-screen';

/** The Planner's Due list (/planner/due): what to plan next. */
export function Component() {
  return <DueScreen />;
}
