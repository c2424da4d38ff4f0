import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/section';
import { useChannelSetup } from '../hooks/use-channel-setup';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { ChannelList } from './channel-list';
import { MapPanel } from './map-panel';
import { RecordingSummary } from './recording-summary';
import { RegisterForm } from './register-form';

/** Mount keyed by fingerprint: the setup state belongs to one recording. */
export function OpenRecordingView({
  recording,
  preferredProjectId,
  onClose,
}: {
  recording: OpenRecording;
  preferredProjectId: number | null;
  onClose: () => void;
}) {
  const { setup, change, flush, saveState } = useChannelSetup(recording.entry.fingerprint, recording.entry.setup);
  return (
    <div className="flex flex-col gap-6">
      <Section title="Recording">
        <div className="flex items-start gap-4">
          <div className="min-w-0 flex-1">
            <RecordingSummary recording={recording} />
          </div>
          <Button type="button" variant="quiet" className="px-2.5 py-1" onClick={onClose}>
            Close
          </Button>
        </div>
      </Section>
      <MapPanel recording={recording} setup={setup} />
      <Section title="Channels">
        <div className="flex flex-col gap-3">
          <ChannelList setup={setup} onChange={change} onBlur={flush} />
          <p
            className={`text-xs ${saveState.kind === 'failed' ? 'text-danger' : 'text-mist-500'}`}
            data-testid="setup-save-state"
            role={saveState.kind === 'failed' ? 'alert' : undefined}
          >
            {saveState.kind === 'saved'
              ? 'Setup saved in this browser.'
              : saveState.kind === 'pending'
                ? 'Saving…'
                : saveState.message}
          </p>
        </div>
      </Section>
      <Section title="Register with a project">
        <RegisterForm entry={recording.entry} setup={setup} preferredProjectId={preferredProjectId} />
      </Section>
    </div>
  );
}
