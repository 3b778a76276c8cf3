import { Route, Routes, useParams } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';
import { useMe } from '../../features/auth/api/get-me';
import { UnsentRunsWarning, VisitCapture } from '../../features/decay-runs/components/capture/visit-capture';
import { MyVisitPage } from '../../features/my-visits/components/my-visit-page';
import { MyVisitsList } from '../../features/my-visits/components/my-visits-list';

function ListScreen() {
  const me = useMe();
  if (!me.data) return null;
  return (
    <div className="mx-auto max-w-5xl">
      <PageHeader
        title="My visits"
        lead="The visits assigned to you. Open one at the cabinet to see its banks, the cautions, and to start it."
      />
      <MyVisitsList viewerId={me.data.id} />
    </div>
  );
}

function VisitScreen() {
  const { visitId = '' } = useParams();
  const me = useMe();
  if (!me.data) return null;
  const viewer = { id: me.data.id, roles: me.data.roles };
  return (
    <div className="mx-auto max-w-3xl">
      <MyVisitPage
        visitId={visitId}
        viewer={viewer}
        atCabinet={(visit) => <VisitCapture visit={visit} viewer={viewer} />}
        beforeLogging={(visit) => <UnsentRunsWarning visit={visit} />}
      />
    </div>
  );
}

/** My visits (technicians' start screen): the list, and one visit at `/my-visits/:visitId`. */
export function Component() {
  return (
    <Routes>
      <Route index element={<ListScreen />} />
      <Route path=":visitId" element={<VisitScreen />} />
    </Routes>
  );
}
