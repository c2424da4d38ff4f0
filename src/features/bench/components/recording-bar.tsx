import type { ReactNode } from 'react';
import { Notice } from '../../../components/ui/notice';
import { formatHz, formatSeconds } from '../../../lib/format';
import type { OpenRecording } from '../hooks/use-recording-reader';

/** The open recording's name, format, rate, length and channels, what reading it reported, Close, and the listening controls (children). */
export function RecordingBar({ recording, onClose, children }: { recording: OpenRecording; onClose: () => void; children?: ReactNode }) {
  const { header, nonFinite } = recording.decoded;
  const channelName = (index: number) => header.channels.find((c) => c.index === index)?.name ?? `ch${index + 1}`;
  const reports = [
    ...header.warnings,
    ...nonFinite.map(
      (r) =>
        `${channelName(r.channel)}: ${r.count} ${r.count === 1 ? 'sample was' : 'samples were'} NaN or infinite, the first at frame ${r.firstFrame}; they read as 0.`,
    ),
  ];
  const fact = 'font-mono text-mist-100';
  return (
    <section aria-label="Recording" className="flex shrink-0 flex-col gap-2 rounded-lg border border-ink-800 bg-ink-900 px-3 py-1.5">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-mist-500">
        <p className="min-w-0 break-all text-sm font-medium text-mist-100" data-testid="recording-name">
          {recording.entry.name}
        </p>
        <span>
          <span className={fact}>{header.format.toUpperCase()}</span>
        </span>
        <span>
          <span className={fact} data-testid="recording-sample-rate">
            {formatHz(header.sampleRateHz)}
          </span>
        </span>
        <span>
          <span className={fact} data-testid="recording-duration">
            {formatSeconds(header.durationS)}
          </span>
        </span>
        <span>
          <span className={fact} data-testid="recording-frames">
            {header.frames}
          </span>{' '}
          frames
        </span>
        <span>
          <span className={fact} data-testid="recording-channel-count">
            {header.channels.length}
          </span>{' '}
          {header.channels.length === 1 ? 'channel' : 'channels'}
        </span>
        {children}
        <button type="button" className="ml-auto rounded-md px-2 py-1 text-xs text-mist-300 hover:bg-ink-800 hover:text-mist-100" onClick={onClose}>
          Close
        </button>
      </div>
      {reports.length > 0 && (
        <Notice>
          <ul className="flex flex-col gap-1" data-testid="recording-warnings">
            {reports.map((text, i) => (
              <li key={i}>{text}</li>
            ))}
          </ul>
        </Notice>
      )}
    </section>
  );
}
