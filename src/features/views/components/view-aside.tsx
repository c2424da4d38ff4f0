import { Link } from 'react-router-dom';
import type { ViewDetail } from '../../../../server/schemas/views';
import { Section } from '../../../components/ui/section';
import { linkClass } from '../../../components/ui/styles';
import { benchFor } from '../../../config/paths';
import type { useViewPage } from '../hooks/use-view-page';
import { ReportButton } from './report-button';
import { SharePanel } from './share-panel';

/** Beside the view: sharing (engineers and leads), the PDF report, and the way back onto the Bench. */
export function ViewAside({ view, page }: { view: ViewDetail; page: ReturnType<typeof useViewPage> }) {
  const { me, isEngineer, project, snapshot, marks } = page;
  return (
    <>
      {isEngineer && (
        <SharePanel viewId={view.id} archived={view.archived} members={(page.members.data?.members ?? []).filter((m) => m.userId !== me?.id)} />
      )}
      <Section title="Report">
        <p className="mb-2 text-sm text-mist-300">A printable PDF of this view: settings, map with guides and marks, findings, tracks and threads.</p>
        <ReportButton view={view} projectName={project.data?.name ?? ''} recording={page.recording} snapshot={snapshot.data} marks={marks.data} me={me?.name ?? ''} />
      </Section>
      {page.fingerprint && (page.inLibrary.data || page.demoFile) && (
        <Section title="On the Bench">
          <p className="mb-2 text-sm text-mist-300">
            {page.inLibrary.data ? "This browser's library holds the recording of this view." : 'The recording of this view is one of the demo recordings.'}
          </p>
          <Link
            to={benchFor({ fingerprint: page.fingerprint, demoFile: page.inLibrary.data ? null : page.demoFile, viewId: view.id, compare: page.comparedRuns })}
            className={linkClass}
          >
            Open live on the Bench
          </Link>
        </Section>
      )}
    </>
    );
}
