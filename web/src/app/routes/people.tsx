import { UpcomingScreen } from '../../components/ui/upcoming-screen';

export function Component() {
  return (
    <UpcomingScreen
      title="People"
      lead="Who may use Ebbline, and in which roles."
      plans={[
        'Search users and see their last sign-in',
        'Grant roles and deactivate accounts',
      ]}
    />
  );
}
