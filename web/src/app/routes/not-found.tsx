import { Link } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';

export function Component() {
  return (
    <div>
      <PageHeader title="No such page" lead="The address does not lead to a screen of Ebbline." />
      <Link to="/fleet" className="font-medium text-tide-600 underline">
        Go to the fleet overview
      </Link>
    </div>
  );
}
