import { Route, Routes, useParams } from 'react-router';
import { PageHeader } from '../../components/ui/page-header';
import { useMe } from '../../features/auth/api/get-me';
import { UnsentRunsWarning, VisitCapture } from '../../features/decay-runs/components/capture/visit-capture';
import { VisitPhotos } from '../../features/decay-runs/components/photos/visit-photos';
import { VisitRuns } from '../../features/decay-runs/components/verdict/visit-runs';
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
        atCabinet={(visit) => (
          <>
            <VisitCapture visit={visit} viewer={viewer} />
            <section aria-labelledby="visit-photos-heading" className="mt-6 space-y-2">
              <h2 id="visit-photos-heading" className="text-xl font-bold text-tide-900">
                Photos of the visit
              </h2>
              <p className="text-sm text-tide-800">The cabinet, its label, anything worth showing the reviewer. Photos of one bank are added with its run.</p>
              <VisitPhotos visitId={visit.id} canAdd />
            </section>
          </>
        )}
        beforeLogging={(visit) => <UnsentRunsWarning visit={visit} />}
        recorded={(visit) => <VisitRuns visitId={visit.id} viewer={viewer} />}
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
