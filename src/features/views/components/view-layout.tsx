import { useMemo, useState, type ReactNode } from 'react';
import type { GuideRef, Mark, ViewState } from '../../../../server/schemas/views';
import { upgradeViewState } from '../../../../server/schemas/views';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { colourScaleLabel } from '../../../lib/plot/colour-scales';
import type { DecodedSnapshot } from '../api/snapshot';
import type { AxisSpec } from '../snapshot/axes';
import { guideLines } from '../snapshot/guide-lines';
import { scaleOrDefault } from '../../../lib/plot/colour-scales';
import { FindingsList } from './findings-list';
import { GuidesList } from './guides-list';
import { MarkCard } from './mark-card';
import { SnapshotFigure, type PendingPlace } from './snapshot-figure';
import { TracksChart } from './tracks-chart';
import { ComparisonSection } from './comparison-section';

export interface SnapshotSource {
  hasSnapshot: boolean;
  data: DecodedSnapshot | undefined;
  isPending: boolean;
  error: Error | null;
}

interface ViewLayoutProps {
  heading: ReactNode;
  state: ViewState;
  snapshot: SnapshotSource;
  marks: Mark[] | undefined;
  marksError?: Error | null;
  selectedMarkId: number | null;
  onSelectMark: (id: number) => void;
  /** Per mark: its body in place of the plain text (with edit and delete), and its thread. */
  markParts: (mark: Mark, number: number, selected: boolean) => { body?: ReactNode; thread: ReactNode };
  /** The view's own thread. */
  discussion: ReactNode;
  /** For those who may place marks. */
  placing?: {
    pending: PendingPlace | null;
    onPick: (place: PendingPlace) => void;
    form: ReactNode;
  };
  /** Below the marks: sharing, the Bench. */
  aside?: ReactNode;
}

/** The page of one view, shared by the View page and the page of a share link. */
export function ViewLayout({
  heading,
  state: rawState,
  snapshot,
  marks,
  marksError,
  selectedMarkId,
  onSelectMark,
  markParts,
  discussion,
  placing,
  aside,
}: ViewLayoutProps) {
  const state = upgradeViewState(rawState);
  const header = snapshot.data?.header;
  const axes = (header?.axes ?? state.axes) as { x: AxisSpec; y: AxisSpec };
  const lines = useMemo(() => guideLines(state, header ? (header.axes as { x: AxisSpec; y: AxisSpec }) : null), [state, header]);
  const scale = scaleOrDefault(state.colourRange.scale);
  const [finding, setFinding] = useState<number | null>(null);
  const selected = marks?.find((m) => m.id === selectedMarkId) ?? null;
  const selectedGuide =
    placing?.pending?.kind === 'guide'
      ? placing.pending.geometry.guide
      : selected?.kind === 'guide'
        ? (selected.geometry as { guide: GuideRef }).guide
        : null;

  return (
    <div className="mx-auto max-w-7xl px-6 py-8">
      {heading}
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]">
        <div className="flex min-w-0 flex-col gap-6">
          <Section title="Snapshot">
            <div className="flex flex-col gap-4">
              {!snapshot.hasSnapshot && (
                <p className="rounded-md border border-dashed border-ink-700 px-4 py-10 text-center text-sm text-mist-500">
                  This view was saved without a snapshot of its map. Its marks and guides are listed below.
                </p>
              )}
              {snapshot.hasSnapshot && snapshot.isPending && (
                <div className="flex h-80 items-center justify-center rounded-sm bg-ink-950 text-sm text-mist-500 ring-1 ring-ink-800 lg:h-[26rem]">
                  Loading the snapshot…
                </div>
              )}
              {snapshot.error && <Notice tone="error">{snapshot.error.message}</Notice>}
              {snapshot.data && (
                <SnapshotFigure
                  snapshot={snapshot.data}
                  state={state}
                  colourScale={scale}
                  guides={lines}
                  marks={marks ?? []}
                  selectedMarkId={selectedMarkId}
                  onSelectMark={onSelectMark}
                  pending={placing?.pending ?? null}
                  onPick={placing?.onPick}
                  highlightedFinding={finding}
                />
              )}
              <MapSettings state={state} scaleName={colourScaleLabel[scale]} />
              {placing?.form}
            </div>
          </Section>
          <div className="grid items-start gap-6 md:grid-cols-2">
            <Section title="Guides">
              <GuidesList
                lines={lines}
                highlighted={selectedGuide}
                onMarkGuide={placing ? (guide) => placing.onPick({ kind: 'guide', geometry: { guide } }) : undefined}
              />
            </Section>
            <Section title="Findings">
              {header?.findings && header.findings.length > 0 ? (
                <FindingsList findings={header.findings} axes={axes} highlighted={finding} onHighlight={setFinding} />
              ) : (
                <p className="text-sm text-mist-500">
                  {snapshot.hasSnapshot ? 'The snapshot carries no findings.' : 'Findings travel with a snapshot.'}
                </p>
              )}
            </Section>
          </div>
          {header?.tracks && header.tracks.length > 0 && (
            <Section title="Tracks">
              <TracksChart tracks={header.tracks} xAxis={header.axes.x as AxisSpec} />
            </Section>
          )}
          {state.comparison && <ComparisonSection comparison={state.comparison} />}
          <Section title="Discussion">{discussion}</Section>
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          <Section title="Marks">
            {marksError && <Notice tone="error">{marksError.message}</Notice>}
            {!marks && !marksError && <p className="text-sm text-mist-500">Loading marks…</p>}
            {marks && marks.length === 0 && <p className="text-sm text-mist-500">No marks on this view yet.</p>}
            {marks && marks.length > 0 && (
              <ol className="flex flex-col gap-3" aria-label="Marks">
                {marks.map((m, i) => {
                  const parts = markParts(m, i + 1, m.id === selectedMarkId);
                  return (
                    <MarkCard
                      key={m.id}
                      mark={m}
                      number={i + 1}
                      axes={axes}
                      selected={m.id === selectedMarkId}
                      onSelect={() => onSelectMark(m.id)}
                      body={parts.body}
                    >
                      {parts.thread}
                    </MarkCard>
                  );
                })}
              </ol>
            )}
          </Section>
          {aside}
        </div>
      </div>
    </div>
  );
}

function MapSettings({ state, scaleName }: { state: ViewState; scaleName: string }) {
  const p = state.processing;
  const items = [
    `${p.window} window`,
    `${p.blockSize} samples`,
    `${Math.round(p.overlap * 100)} % overlap`,
    p.scaling,
    p.weighting === 'Z' ? 'unweighted' : `${p.weighting}-weighted`,
    `against ${p.against}`,
    `channel ${p.channelIndex + 1}`,
    `${scaleName} scale`,
  ];
  return (
    <p className="flex flex-wrap gap-x-3 gap-y-1 text-xs text-mist-500" data-testid="view-map-settings">
      {items.map((t) => (
        <span key={t} className="font-mono">
          {t}
        </span>
      ))}
    </p>
  );
}
