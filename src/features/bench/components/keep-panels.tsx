import { useBench, useBenchActions } from '../session/bench-session';
import type { ViewCapture } from '../session/capture-view';
import { comparisonStateOf, useComparisonSummary } from '../workspace/use-comparison-summary';
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
  const comparison = comparisonStateOf(useComparisonSummary());
  // with runs compared, the view keeps the comparison too (its map is the baseline's)
  const capture = (): ViewCapture | string => {
    const taken = a.capture();
    if (typeof taken === 'string' || !comparison) return taken;
    return { ...taken, state: { ...(taken.state as object), comparison } };
  };
  return (
    <>
      <BenchPanel title="Register with a project">
        <RegisterForm entry={entry} setup={setup} preferredProjectId={preferredProjectId} />
      </BenchPanel>
      <div className="mt-4">
        <BenchPanel title={comparison ? 'Save the comparison' : 'Save a view'}>
          <SaveViewForm
            entry={entry}
            setup={setup}
            preferredProjectId={fromView?.view.projectId ?? preferredProjectId}
            capture={capture}
            marks={marks}
            fromView={fromView}
            onSaved={() => a.setMarks([])}
          />
        </BenchPanel>
      </div>
    </>
  );
}
