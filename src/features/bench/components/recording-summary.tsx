import type { ReactNode } from 'react';
import { Notice } from '../../../components/ui/notice';
import { formatHz, formatSeconds } from '../../../lib/format';
import type { OpenRecording } from '../hooks/use-recording-reader';

function Fact({ term, children, testId }: { term: string; children: ReactNode; testId?: string }) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-xs uppercase tracking-wider text-mist-500">{term}</dt>
      <dd className="font-mono text-sm text-mist-100" data-testid={testId}>
        {children}
      </dd>
    </div>
  );
}

export function RecordingSummary({ recording }: { recording: OpenRecording }) {
  const { header, nonFinite } = recording.decoded;
  const channelName = (index: number) => header.channels.find((c) => c.index === index)?.name ?? `ch${index + 1}`;
  const reports = [
    ...header.warnings,
    ...nonFinite.map(
      (r) =>
        `${channelName(r.channel)}: ${r.count} ${r.count === 1 ? 'sample was' : 'samples were'} NaN or infinite, the first at frame ${r.firstFrame}; they read as 0.`,
    ),
  ];
  return (
    <div className="flex flex-col gap-4">
      <p className="break-all text-lg font-medium text-mist-100" data-testid="recording-name">
        {recording.entry.name}
      </p>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3 lg:grid-cols-5">
        <Fact term="Format">{header.format.toUpperCase()}</Fact>
        <Fact term="Sample rate" testId="recording-sample-rate">
          {formatHz(header.sampleRateHz)}
        </Fact>
        <Fact term="Duration" testId="recording-duration">
          {formatSeconds(header.durationS)}
        </Fact>
        <Fact term="Frames" testId="recording-frames">
          {header.frames}
        </Fact>
        <Fact term="Channels" testId="recording-channel-count">
          {header.channels.length}
        </Fact>
      </dl>
      {reports.length > 0 && (
        <Notice>
          <ul className="flex flex-col gap-1" data-testid="recording-warnings">
            {reports.map((text, i) => (
              <li key={i}>{text}</li>
            ))}
          </ul>
        </Notice>
      )}
    </div>
  );
}
