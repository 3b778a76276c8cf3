import { UpcomingScreen } from '../../components/ui/upcoming-screen';

export function Component() {
  return (
    <UpcomingScreen
      title="My visits"
      lead="The visits assigned to you, ready to open at the cabinet."
      plans={[
        'Open a visit at the cabinet',
        'Follow a guided, timed capture of the decay readings',
      ]}
    />
  );
}
