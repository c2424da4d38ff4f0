import { useBench, useBenchActions } from '../session/bench-session';
import { BenchPanel } from './bench-panel';
import { RegisterForm } from './register-form';
import { SaveViewForm } from './save-view-form';

/** Register the recording with a project, and save what the Bench shows as a view. */
export function KeepPanels() {
  const a = useBenchActions();
  const entry = useBench((s) => s.recording.entry);
  const setup = useBench((s) => s.setup);
  const preferredProjectId = useBench((s) => s.preferredProjectId);
  const fromView = useBench((s) => s.fromView);
  const marks = useBench((s) => s.marks);
  return (
    <>
      <BenchPanel title="Register with a project">
        <RegisterForm entry={entry} setup={setup} preferredProjectId={preferredProjectId} />
      </BenchPanel>
      <div className="mt-4">
        <BenchPanel title="Save a view">
          <SaveViewForm
            entry={entry}
            setup={setup}
            preferredProjectId={fromView?.view.projectId ?? preferredProjectId}
            capture={a.capture}
            marks={marks}
            fromView={fromView}
            onSaved={() => a.setMarks([])}
          />
        </BenchPanel>
      </div>
    </>
  );
}
