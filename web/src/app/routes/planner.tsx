import { UpcomingScreen } from '../../components/ui/upcoming-screen';

export function Component() {
  return (
    <UpcomingScreen
      title="Planner"
      lead="Inspection visits on a calendar, inside shutdown windows."
      plans={[
        'Plan visits inside shutdown windows',
        'Assign technicians',
      ]}
    />
  );
}
