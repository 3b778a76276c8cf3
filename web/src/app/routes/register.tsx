import { UpcomingScreen } from '../../components/ui/upcoming-screen';

export function Component() {
  return (
    <UpcomingScreen
      title="Register"
      lead="Sites, areas, cabinets, DC-link banks, bank designs and spares."
      plans={[
        'Keep sites, areas and cabinets with their drives',
        'Record each bank with its design and baseline',
        'Track spares and their reforming dates',
      ]}
    />
  );
}
