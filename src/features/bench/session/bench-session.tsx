import { createContext, useContext, useEffect, useLayoutEffect, useMemo, useRef, useState, useSyncExternalStore, type ReactNode } from 'react';
import type { OpenRecording } from '../hooks/use-recording-reader';
import type { GuidesState } from '../map/guides';
import type { BenchRestore, ViewOnBench } from '../view-state/view-restore';
import { captureView } from './capture-view';
import { createBenchStores, type BenchStores } from './live-stores';
import { createStore, type Store } from './store';
import { useAnalysisModel } from './use-analysis-model';
import { useHearing } from './use-hearing';
import { useInputsModel } from './use-inputs-model';
import { useMapModel } from './use-map-model';
import { useRecordingChannels } from './use-recording-channels';
import { useViewModel } from './use-view-model';

/**
 * One Bench session: recording → channel setup → speed → map → findings → guide lines → tracks (and,
 * for a microphone, its loudness and tonality), and
 * how the engineer looks at them. The model hooks own every computation (they alone start worker
 * tasks); the state lands in a store that panels read through selectors, so a panel re-renders only
 * for what it shows.
 */
function useBenchModel(
  opened: OpenRecording,
  fromView: ViewOnBench | undefined,
  preferredProjectId: number | null,
  live: BenchStores,
  start: BenchRestore | undefined,
  follow: FollowedView | undefined,
) {
  const restore = fromView?.restore ?? start;
  const channels = useRecordingChannels(opened);
  const recording = channels.recording;
  const inputs = useInputsModel(recording, restore);
  const map = useMapModel(recording, inputs.state.setup, inputs.state.speed, restore, follow?.against, channels.filling);
  const m = map.state;
  // the channels in use are read from the file when first needed: the map's and the speed's
  const source = inputs.state.speedSource;
  const speedChannel = source.kind === 'tacho' || source.kind === 'channel' ? source.channel : -1;
  const { ensure } = channels;
  useEffect(() => ensure([m.settings.channel, speedChannel]), [ensure, m.settings.channel, speedChannel]);
  const analysis = useAnalysisModel(
    {
      power: m.map.power,
      done: m.map.done,
      frames: m.map.layout?.frames ?? 0,
      frameRpm: m.frameRpm,
      rpmStep: m.rpmStep,
      against: m.against,
      settings: m.settings,
      enbwBins: m.enbwBins,
      reference: m.reference,
      channelSetup: m.channelSetup,
      typedPoles: inputs.state.typedPoles,
      mapChannel: m.mapChannel,
      owner: recording.entry.fingerprint,
    },
    restore,
    follow?.guides,
  );
  const hearing = useHearing({
    channel: m.mapChannel,
    fsHz: recording.decoded.header.sampleRateHz,
    soundPressure: analysis.state.soundPressure,
    owner: recording.entry.fingerprint,
  });
  const view = useViewModel({
    live,
    fromView,
    raster: m.raster,
    layout: m.map.layout,
    power: m.map.power,
    extents: m.extents,
    against: m.against,
    frameRpm: m.frameRpm,
    rpmStep: m.rpmStep,
    windowName: m.settings.windowName,
    report: analysis.state.report,
    detectedHz: analysis.state.detectedHz,
    dispatchGuides: analysis.actions.dispatchGuides,
    follow,
  });
  const state = {
    recording,
    channelReading: channels.reading,
    channelError: channels.error,
    /** Reads these channels from the file if they are not read yet (the one heard, say). */
    readChannels: ensure,
    fromView, preferredProjectId, following: follow !== undefined, ...inputs.state, ...m, ...analysis.state, ...hearing.state, ...view.state };
  const actions = {
    ...inputs.actions,
    ...map.actions,
    ...analysis.actions,
    ...hearing.actions,
    ...view.actions,
    capture: () => captureView(state, live.viewport.get()),
  };
  return { state, actions };
}

export type BenchState = ReturnType<typeof useBenchModel>['state'];
export type BenchActions = ReturnType<typeof useBenchModel>['actions'];

interface SessionContext {
  store: Store<BenchState>;
  actions: BenchActions;
  live: BenchStores;
}

const Session = createContext<SessionContext | null>(null);

/** Actions that never change identity, each calling the latest closure (so panels need not re-render for them). */
function stableActions<A extends object>(latest: { current: A }): A {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(latest.current)) out[key] = (...args: unknown[]) => (latest.current as Record<string, (...a: unknown[]) => unknown>)[key](...args);
  return out as A;
}

/**
 * A session that follows another (a run compared with the baseline): the guides, the axis along x and
 * the swap are the baseline's, and the baseline's zoom and pointer stores drive its map.
 */
export interface FollowedView {
  guides: GuidesState;
  against: 'time' | 'speed';
  swapped: boolean;
}

/** Mount keyed by the recording's fingerprint: all of a session belongs to one recording. */
export function BenchSession({
  recording,
  fromView,
  preferredProjectId,
  start,
  follow,
  live: sharedLive,
  onPublish,
  children,
}: {
  recording: OpenRecording;
  /** A saved view of this recording to start from (`?view=`): its settings, guides, zoom and marks */
  fromView?: ViewOnBench;
  preferredProjectId: number | null;
  /** Settings to start from when there is no saved view (a compared run starts from the baseline's) */
  start?: BenchRestore;
  follow?: FollowedView;
  /** The zoom and pointer stores of the session this one follows */
  live?: BenchStores;
  /** Told the session's state after every change (the workspace of compared runs listens) */
  onPublish?: (state: BenchState) => void;
  children: ReactNode;
}) {
  const [ownLive] = useState(createBenchStores);
  const live = sharedLive ?? ownLive;
  const { state, actions } = useBenchModel(recording, fromView, preferredProjectId, live, start, follow);
  const [store] = useState(() => createStore(state));
  useLayoutEffect(() => {
    store.set(state);
    onPublish?.(state);
  });
  const latest = useRef(actions);
  useLayoutEffect(() => {
    latest.current = actions;
  });
  const [stable] = useState(() => stableActions(latest));
  const value = useMemo(() => ({ store, actions: stable, live }), [store, stable, live]);
  return <Session.Provider value={value}>{children}</Session.Provider>;
}

function useSession(): SessionContext {
  const s = useContext(Session);
  if (!s) throw new Error('A Bench panel was rendered outside its BenchSession.');
  return s;
}

/** One piece of the session; select a field (or something else that keeps its identity), not a new object. */
export function useBench<T>(select: (s: BenchState) => T): T {
  const { store } = useSession();
  return useSyncExternalStore(store.subscribe, () => select(store.get()));
}

export const useBenchActions = (): BenchActions => useSession().actions;

/** The session's state as it is now, without subscribing (for a one-off read, such as a starting point). */
export const useBenchSnapshot = (): (() => BenchState) => useSession().store.get;

/** The pointer and the zoom: they change many times a second, so they are stores of their own. */
export const useBenchLive = (): BenchStores => useSession().live;
