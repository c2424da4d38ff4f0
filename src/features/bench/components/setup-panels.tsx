import { useBench, useBenchActions } from '../session/bench-session';
import { BenchPanel } from './bench-panel';
import { ChannelList } from './channel-list';
import { SpeedSourceForm } from './speed-source';

/** The recording's channels: names, quantities, units and calibrations, saved in this browser. */
export function ChannelsPanel() {
  const a = useBenchActions();
  const setup = useBench((s) => s.setup);
  const saveState = useBench((s) => s.setupSave);
  return (
    <BenchPanel title="Channels">
      <div className="flex flex-col gap-3">
        <ChannelList setup={setup} onChange={a.changeSetup} onBlur={a.flushSetup} />
        <p
          className={`text-xs ${saveState.kind === 'failed' ? 'text-danger' : 'text-mist-500'}`}
          data-testid="setup-save-state"
          role={saveState.kind === 'failed' ? 'alert' : undefined}
        >
          {saveState.kind === 'saved' ? 'Setup saved in this browser.' : saveState.kind === 'pending' ? 'Saving…' : saveState.message}
        </p>
      </div>
    </BenchPanel>
  );
}

/** Where the speed comes from, the speed it gives, and the pole pairs (typed or inferred). */
export function SpeedPanel() {
  const a = useBenchActions();
  const source = useBench((s) => s.speedSource);
  const automatic = useBench((s) => s.speedAutomatic);
  const setup = useBench((s) => s.setup);
  const speed = useBench((s) => s.speed);
  const poles = useBench((s) => s.poles);
  const findings = useBench((s) => s.findings);
  const saveError = useBench((s) => s.speedSaveError);
  const report = findings.kind === 'done' ? findings.value : null;
  return (
    <BenchPanel title="Speed source">
      <SpeedSourceForm
        source={source}
        automatic={automatic}
        setup={setup}
        state={speed}
        onChange={a.chooseSpeed}
        poles={poles}
        onPoles={a.setPoles}
        inferred={{
          value: report && report.polePairs.source === 'inferred' ? report.polePairs.value : null,
          ambiguous: report?.polePairs.ambiguous ?? false,
          settledByChannel: report?.polePairs.settledByChannel ?? false,
          pattern: report?.polePairs.pattern ?? null,
          pending: findings.kind !== 'done',
        }}
      />
      {saveError && (
        <p className="mt-2 text-xs text-danger" role="alert">
          {saveError.message}
        </p>
      )}
    </BenchPanel>
  );
}
