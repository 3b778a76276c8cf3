import { UpcomingScreen } from '../../components/ui/upcoming-screen';

export function Component() {
  return (
    <UpcomingScreen
      title="Alerts"
      lead="Banks whose action is due, and who has been told."
      plans={[
        'See banks nearing end of life',
        'Choose who is e-mailed when action is due',
      ]}
    />
  );
}
