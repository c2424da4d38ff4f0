import { useCallback, useEffect, useMemo, useReducer, useRef, useState, type ReactNode } from 'react';
import { MAIN_LOBE_HALF_BINS, patternOfQuantity } from '../../../../workers/dsp/inverter-analysis';
import { peakNear } from '../../../../workers/dsp/peak';
import { rpmAtTimes } from '../../../../workers/dsp/speed';
import { makeWindow } from '../../../../workers/dsp/window';
import { calibrationProblem, unitsPerFileUnit } from '../../../../workers/io/channel-setup';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { MARK_TEXT_MAX } from '../../../../server/schemas/views';
import { formatHz, formatSeconds } from '../../../lib/format';
import { computeTracks, frameAt, frameAtRpm, frameTimes as frameTimesOf } from '../analysis/spectra';
import { useFindings, useSpeedMap } from '../hooks/use-analysis';
import { useChannelSetup } from '../hooks/use-channel-setup';
import { useMapComputation } from '../hooks/use-map-computation';
import { useSpeedChoice } from '../hooks/use-speed-choice';
import type { OpenRecording } from '../hooks/use-recording-reader';
import { defaultSpeedSource, useSpeedCurve } from '../hooks/use-speed-curve';
import { colourLut } from '../map/colour-scales';
import { defaultFamilies, guidesReducer, initialGuides, resolveLines, uniqueLabels } from '../map/guides';
import { dbUnit, levelReference } from '../map/level-reference';
import type { MapRaster } from '../map/map-raster';
import { speedStep } from '../map/speed-raster';
import { clampViewport, centreOf, fullView, panScreen, zoomAbout, type Extents, type Viewport } from '../map/viewport';
import { BenchStoresContext, createBenchStores, type BenchPointer } from '../state/bench-stores';
import { BenchPanel } from './bench-panel';
import { ChannelList } from './channel-list';
import { Dock } from './dock';
import { carrierSummary, FindingsPanel, type GoTo } from './findings-panel';
import { GuidesPanel } from './guides-panel';
import { MapPanel } from './map-panel';
import { DEFAULT_RANGE_DB, MapSettingsBar, useMapSettings, useSettledValue } from './map-settings';
import type { MapMode, MarkPlace } from './map-view';
import { SaveViewForm, type ViewCapture } from './save-view-form';
import { benchViewState, quantiseVisible, snapshotHeaderOf, type BenchMark, type BenchViewInputs } from '../views/view-snapshot';
import type { ViewOnBench } from '../views/view-restore';
import { GuideMarkPicker, markableGuides, PendingMarks, SavedMarks, useSavedMarksOnMap, type MarkableGuide } from './bench-marks';
import { RegisterForm } from './register-form';
import { ShortcutsDialog, useShortcuts } from './shortcuts';
import { SpeedSourceForm, type PoleChoice } from './speed-source';

const MIN_BLOCK_SAMPLES = 256;
/** A calibration being typed is taken a moment after the last key. */
const CALIBRATION_PAUSE_MS = 300;
const validScale = (v: number) => Number.isFinite(v) && v !== 0;

function extentsOf(raster: MapRaster, minX: number): Extents {
  const [f0, f1] = raster.frequencySpanHz;
  return { x: raster.timeSpanS, f: [f0, f1], minX, minF: 8 * raster.layout.binHz * raster.binsPerRow };
}

/**
 * The Bench for one open recording: the channels and speed source (left), the map with its readout and
 * the dock (centre), the guides and findings (right). Mount it keyed by fingerprint: all of its state
 * belongs to one recording. The pointer and the view change many times a second, so they live in
 * stores (not React state) that the map draws from and only the readouts subscribe to.
 */
export function Workbench({
  recording,
  intake,
  preferredProjectId,
  fromView,
  onClose,
}: {
  recording: OpenRecording;
  intake: ReactNode;
  preferredProjectId: number | null;
  /** A saved view of this recording to start from (`?view=`): its settings, guides, zoom and marks */
  fromView?: ViewOnBench;
  onClose: () => void;
}) {
  const restore = fromView?.restore;
  const { header, samples: channelSamples, channelIndices } = recording.decoded;
  const fsHz = header.sampleRateHz;
  const { setup, change, flush, saveState } = useChannelSetup(recording.entry.fingerprint, recording.entry.setup);
  const stores = useMemo(createBenchStores, []);

  // Channels and speed
  const [speedChoice, setSpeedChoice, speedSaveError] = useSpeedChoice(recording.entry.fingerprint, setup, recording.entry.speedSource, restore?.speedSource);
  const speedSource = speedChoice ?? defaultSpeedSource(setup);
  const [poles, setPoles] = useState<PoleChoice>(restore?.poles ?? { mode: 'inferred' });
  const channels = useMemo(() => ({ indices: channelIndices, samples: channelSamples }), [channelIndices, channelSamples]);
  const speed = useSpeedCurve(speedSource, setup, channels, fsHz, header.durationS);

  // The map
  const s = useMapSettings(header.frames, setup, restore);
  const channelSetup = setup.find((c) => c.index === s.channel) ?? setup[0];
  const at = channelIndices.indexOf(channelSetup?.index ?? -1);
  const samples = at >= 0 ? channelSamples[at] : null;
  const calibrationBad = channelSetup ? calibrationProblem(channelSetup.calibration) !== null : false;
  const typedScale = channelSetup && !calibrationBad ? unitsPerFileUnit(channelSetup.calibration) : Number.NaN;
  const scale = useSettledValue(typedScale, validScale, CALIBRATION_PAUSE_MS, s.channel);
  const reference = useMemo(() => levelReference(channelSetup ?? { quantity: 'other', unit: '' }), [channelSetup]);
  const settings = useMemo(() => ({ blockSize: s.blockSize, overlap: s.overlap, window: s.windowName }), [s.blockSize, s.overlap, s.windowName]);
  const tooShort = header.frames < MIN_BLOCK_SAMPLES;
  const map = useMapComputation({
    samples: tooShort || !validScale(scale) ? null : samples,
    fsHz,
    settings,
    weighting: s.weighting,
    scale,
    refRms: reference.refRms,
  });
  const { layout, status } = map;
  const done = status.kind === 'done';
  const enbwBins = useMemo(() => makeWindow(s.windowName, s.blockSize).enbwBins, [s.windowName, s.blockSize]);

  const parsedTop = s.topText === null ? Number.NaN : Number(s.topText);
  const manualTop = s.topText !== null && Number.isFinite(parsedTop);
  const topDb = manualTop ? parsedTop : (map.peakTopDb ?? 0);
  const parsedRange = Number(s.rangeText);
  const rangeOk = Number.isFinite(parsedRange) && parsedRange > 0 && parsedRange <= 400;
  const rangeDb = rangeOk ? parsedRange : DEFAULT_RANGE_DB;
  const lut = colourLut(s.colours);

  // Speed per frame, the map against speed, the findings
  const frameTimes = useMemo(() => (layout && layout.frames > 0 ? frameTimesOf(layout) : null), [layout]);
  const frameRpm = useMemo(() => (speed.kind === 'done' && frameTimes ? rpmAtTimes(speed.curve, frameTimes) : null), [speed, frameTimes]);
  const rpmStep = useMemo(() => (frameRpm ? speedStep(frameRpm) : 50), [frameRpm]);
  const [againstChoice, setAgainst] = useState<'time' | 'speed'>(restore?.against ?? 'time');
  const against = againstChoice === 'speed' && frameRpm ? 'speed' : 'time';
  const speedMap = useSpeedMap(map.power, done, frameRpm, rpmStep, s.weighting, reference.refRms, against === 'speed');
  const speedRaster = speedMap.kind === 'done' ? speedMap.value : null;
  const typedPoles = poles.mode === 'typed' && Number.isInteger(poles.value) && poles.value >= 1 ? poles.value : null;
  const [guides, dispatch] = useReducer(guidesReducer, restore?.guides ?? initialGuides);
  const orderKs = guides.orders.filter((o) => !o.hidden).map((o) => o.order).join(',');
  const findings = useFindings(map.power, done, frameRpm, s.windowName, enbwBins, typedPoles, orderKs, patternOfQuantity(channelSetup?.quantity ?? 'other'));
  const report = findings.kind === 'done' ? findings.value : null;
  const polePairs = typedPoles ?? report?.polePairs.value ?? null;
  const detectedHz = useMemo(() => (report && report.carrier.hz.some((h) => Number.isFinite(h)) ? Float64Array.from(report.carrier.hz) : null), [report]);

  // Guides
  const lines = useMemo(
    () => (layout ? resolveLines(guides, { frames: layout.frames, frameRpm, polePairs, detectedHz }) : []),
    [guides, layout, frameRpm, polePairs, detectedHz],
  );

  // The view
  const raster = against === 'speed' ? (speedRaster?.raster ?? null) : map.raster;
  const extents = useMemo(
    () => (raster && layout ? extentsOf(raster, against === 'speed' ? 4 * rpmStep : 4 * layout.hopS) : null),
    [raster, layout, against, rpmStep],
  );
  const extentsKey = extents ? `${against}:${extents.x.join(',')}:${extents.f.join(',')}` : '';
  // Another map of the same span (a new window, colours, calibration) keeps the view; another span starts
  // whole. A saved view's zoom waits for the first map against the same axis (speed comes after time).
  const viewKey = useRef('');
  const savedZoom = useRef(restore?.viewport ?? null);
  useEffect(() => {
    if (!extents) {
      stores.viewport.set(null);
      viewKey.current = '';
      return;
    }
    const v = stores.viewport.get();
    const zoom = savedZoom.current && against === restore?.against ? savedZoom.current : null;
    if (zoom) savedZoom.current = null;
    stores.viewport.set(zoom ? clampViewport(zoom, extents) : v && viewKey.current === extentsKey ? clampViewport(v, extents) : fullView(extents));
    viewKey.current = extentsKey;
  }, [extentsKey]);
  const setView = useCallback(
    (f: (e: Extents) => Viewport) => {
      if (extents) stores.viewport.set(f(extents));
    },
    [extents, stores],
  );

  const [swapped, setSwapped] = useState(restore?.swapped ?? false);
  const [mode, setMode] = useState<MapMode>('pan');
  const [pinnedTimeS, setPinnedTimeS] = useState<number | null>(null);
  const [help, setHelp] = useState(false);
  const [note, setNote] = useState<string | null>(null);
  // Marks placed on the map, kept until the view is saved
  const [marks, setMarks] = useState<BenchMark[]>([]);
  const [markText, setMarkText] = useState('');
  const nextMarkId = useRef(1);
  const onMark = useCallback(
    (place: MarkPlace) => {
      const id = nextMarkId.current++;
      setMarks((ms) => [...ms, { ...place, id, text: markText.trim() }]);
    },
    [markText],
  );
  const onMarkGuide = useCallback(
    (g: MarkableGuide) => {
      const id = nextMarkId.current++;
      setMarks((ms) => [...ms, { id, kind: 'guide', guide: g.guide, label: g.label, text: markText.trim() }]);
    },
    [markText],
  );
  const savedMarks = useSavedMarksOnMap(fromView, against);
  // numbered as the view page will: the saved view's marks first, then these in the order placed
  const firstPending = savedMarks.marks.length + 1;
  const shownMarks = useMemo(() => [...savedMarks.onMap, ...marks.map((m, j) => ({ ...m, number: firstPending + j }))], [savedMarks.onMap, marks, firstPending]);
  const pinnedX = pinnedTimeS === null ? null : against === 'time' ? pinnedTimeS : layout && frameRpm ? frameRpm[frameAt(layout, pinnedTimeS)] : null;

  const probe = useCallback(
    (x: number, f: number): BenchPointer | null => {
      if (!raster || !layout) return null;
      const [X0, X1] = raster.timeSpanS;
      const [F0, F1] = raster.frequencySpanHz;
      const hit = raster.probe((x - X0) / (X1 - X0), (f - F0) / (F1 - F0));
      if (!hit) return null;
      const column = Math.min(raster.columns - 1, Math.floor(((x - X0) / (X1 - X0)) * raster.columns));
      if (against === 'speed' && frameRpm) {
        const frame = frameAtRpm(frameRpm, hit.timeS);
        return { x, f, timeS: layout.t0S + frame * layout.hopS, rpm: hit.timeS, levelDb: hit.levelDb, frame, column, from: 'map' };
      }
      const frame = frameAt(layout, hit.timeS);
      return { x, f, timeS: hit.timeS, rpm: frameRpm?.[frame] ?? NaN, levelDb: hit.levelDb, frame, column, from: 'map' };
    },
    [raster, layout, against, frameRpm],
  );

  const addCarrierAt = useCallback(
    (hz: number, source: 'typed' | 'detected') => dispatch({ type: 'add-carrier', source, centreHz: Math.round(hz), families: defaultFamilies(report && !report.polePairs.ambiguous ? report.polePairs.pattern : null) }),
    [report],
  );
  // A picked centre snaps to the line nearest the click, between bins (peakNear): within a
  // main lobe or two, or about a hundredth of the visible frequency span (a few pixels), the wider.
  const onPick = useCallback(
    (fHz: number) => {
      const bin = layout?.binHz ?? 1;
      let centre = Math.round(fHz / bin) * bin;
      const at = stores.pointer.get();
      const power = map.power;
      if (power && at && at.frame >= 0 && at.frame < power.frames) {
        const bins = power.layout.bins;
        const row = power.power.subarray(at.frame * bins, (at.frame + 1) * bins);
        const view = stores.viewport.get();
        const reach = Math.max(2 * MAIN_LOBE_HALF_BINS[s.windowName], view ? (0.012 * (view.f[1] - view.f[0])) / bin : 0);
        const peak = peakNear(row, fHz / bin, reach);
        if (peak) {
          centre = peak.bin * bin;
          setNote(`The carrier guide snapped to the line at ${Math.round(centre)} Hz nearest the click (${Math.round(fHz)} Hz); type another centre in the guide if you meant another.`);
        }
      }
      addCarrierAt(centre, 'typed');
      setMode('pan');
    },
    [addCarrierAt, layout, stores, map.power, s.windowName],
  );
  const onPin = useCallback(
    (x: number) => {
      if (!layout) return;
      setPinnedTimeS(against === 'time' ? x : frameRpm ? layout.t0S + frameAtRpm(frameRpm, x) * layout.hopS : null);
    },
    [against, frameRpm, layout],
  );

  const goTo = useCallback(
    (g: GoTo) => {
      if (!extents || !layout) return;
      const t = g.timeS;
      if (t !== null) setPinnedTimeS(t);
      setView((e) => {
        const f: [number, number] = [Math.max(e.f[0], g.fromHz), Math.min(e.f[1], g.toHz)];
        if (t === null) return clampViewport({ x: e.x, f }, e);
        if (against === 'speed' && frameRpm) {
          const rpm = frameRpm[frameAt(layout, t)];
          const half = Math.max(4 * rpmStep, (e.x[1] - e.x[0]) * 0.08);
          return clampViewport({ x: [rpm - half, rpm + half], f }, e);
        }
        const half = Math.max(4 * layout.hopS, Math.min(1.5, (e.x[1] - e.x[0]) * 0.15));
        return clampViewport({ x: [t - half, t + half], f }, e);
      });
    },
    [extents, layout, against, frameRpm, rpmStep, setView],
  );

  const zoom = useCallback(
    (factor: number) => {
      const v = stores.viewport.get();
      if (!v) return;
      const ptr = stores.pointer.get();
      const about = ptr && ptr.from === 'map' ? { x: ptr.x, f: ptr.f } : centreOf(v);
      setView((e) => zoomAbout(v, e, factor, about));
    },
    [stores, setView],
  );

  const addTyped = useCallback((hz: number) => addCarrierAt(hz, 'typed'), [addCarrierAt]);
  const setPicking = useCallback((on: boolean) => setMode(on ? 'pick' : 'pan'), []);
  const unpin = useCallback(() => setPinnedTimeS(null), []);

  const addDetectedCarrier = useCallback(() => {
    if (!detectedHz) {
      setNote('The carrier has not been found yet: wait for the findings, or type a centre.');
      return;
    }
    setNote(null);
    const found = [...detectedHz].filter(Number.isFinite).sort((a, b) => a - b);
    addCarrierAt(found[found.length >> 1], 'detected');
  }, [detectedHz, addCarrierAt]);

  useShortcuts({
    zoom,
    pan: (right, down) => {
      const v = stores.viewport.get();
      if (v) setView((e) => panScreen(v, e, swapped, right, down));
    },
    reset: () => setView(fullView),
    swap: () => setSwapped((w) => !w),
    addOrder: () => dispatch({ type: 'add-next-order' }),
    addCarrier: addDetectedCarrier,
    toggleMark: () => setMode((m) => (m === 'mark' ? 'pan' : 'mark')),
    toggleHelp: () => setHelp((h) => !h),
    escape: () => {
      setHelp(false);
      setMode('pan');
    },
    modal: help,
  });

  // The dock's tracks of the selected lines, for the snapshot (computed once, when the view is saved).
  const tracksForSnapshot = () => {
    const selected = lines.filter((l) => l.selected);
    if (!done || !map.power || selected.length === 0) return null;
    const series = computeTracks(selected, lines, map.power.power, map.power.layout, s.windowName, enbwBins, against, frameRpm, rpmStep, s.weighting, reference.refRms);
    return { series, names: uniqueLabels(selected), unit: `${dbUnit(s.weighting)} re ${reference.label}` };
  };

  const capture = (): ViewCapture | string => {
    const view = stores.viewport.get();
    if (!raster || !view || !layout) return 'There is no map to save yet.';
    if (raster.columnsDone < raster.columns) return 'Wait for the map to be complete before saving it.';
    if (!rangeOk) return 'Set a level range above 0 dB first.';
    const inputs: BenchViewInputs = {
      channelIndex: channelSetup?.index ?? 0,
      window: s.windowName,
      blockSize: s.blockSize,
      overlap: s.overlap,
      weighting: s.weighting,
      refRms: reference.refRms,
      against,
      swapped,
      view,
      colourScale: s.colours,
      topDb,
      rangeDb,
      guides,
      lines,
      report,
      polePairs,
      speedSource,
      polePairsSource: typedPoles !== null ? 'typed' : polePairs !== null ? 'inferred' : null,
      durationS: header.durationS,
      tracks: tracksForSnapshot(),
    };
    const picture = quantiseVisible(raster, view, swapped, topDb, rangeDb);
    return { state: benchViewState(inputs), header: snapshotHeaderOf(inputs, picture), map: picture.map, swapped };
  };

  const markTools =
    mode === 'mark' || marks.length > 0 || savedMarks.marks.length > 0 ? (
      <div className="flex flex-col gap-3 pl-16" data-testid="mark-tools">
        {fromView && <SavedMarks fromView={fromView} marks={savedMarks} against={restore?.against ?? against} />}
        <div className="flex flex-wrap items-end gap-3">
          <TextField
            label="Mark text"
            className="min-w-56 flex-1"
            maxLength={MARK_TEXT_MAX}
            value={markText}
            onChange={(e) => setMarkText(e.target.value)}
            placeholder="The text of the next mark you place"
          />
          <p className="pb-2 text-xs text-mist-500">
            {mode === 'mark' ? 'Click the map for a point, Shift-drag for a box, or mark a whole guide.' : 'Choose Add mark (m) to place more.'} Marks are saved with the view.
          </p>
          <div className="pb-1">
            <GuideMarkPicker guides={markableGuides(lines)} onMark={onMarkGuide} />
          </div>
        </div>
        <PendingMarks marks={marks} firstNumber={firstPending} against={against} onChange={setMarks} />
      </div>
    ) : null;

  const againstNote =
    against === 'speed' && !speedRaster
      ? speedMap.kind === 'error'
        ? speedMap.message
        : done
          ? 'Resampling the map against speed…'
          : 'The map against speed comes once the map is complete.'
      : null;

  const notices = (
    <>
      {tooShort && <Notice>The recording is shorter than the smallest block ({MIN_BLOCK_SAMPLES} samples), so it has no map.</Notice>}
      {calibrationBad && <Notice tone="error">The calibration of channel {s.channel + 1} is not usable; the map keeps the last one that was.</Notice>}
      {status.kind === 'error' && <Notice tone="error">{status.message}</Notice>}
      {note && <Notice>{note}</Notice>}
    </>
  );

  return (
    <BenchStoresContext.Provider value={stores}>
      {/* Narrow: one column. Wide: channels left, map centre, guides and findings right; in between,
          the guides and findings go under the channels. */}
      <div className="grid items-start gap-4 lg:grid-cols-[17.5rem_minmax(0,1fr)] lg:grid-rows-[auto_auto_1fr] xl:grid-cols-[17.5rem_minmax(0,1fr)_19.5rem]">
        <div className="flex flex-col gap-4 lg:col-start-1 lg:row-start-1">
          {intake}
          <BenchPanel title="Channels">
            <div className="flex flex-col gap-3">
              <ChannelList setup={setup} onChange={change} onBlur={flush} />
              <p
                className={`text-xs ${saveState.kind === 'failed' ? 'text-danger' : 'text-mist-500'}`}
                data-testid="setup-save-state"
                role={saveState.kind === 'failed' ? 'alert' : undefined}
              >
                {saveState.kind === 'saved' ? 'Setup saved in this browser.' : saveState.kind === 'pending' ? 'Saving…' : saveState.message}
              </p>
            </div>
          </BenchPanel>
          <BenchPanel title="Speed source">
            <SpeedSourceForm
              source={speedSource}
              automatic={speedChoice === null}
              setup={setup}
              state={speed}
              onChange={setSpeedChoice}
              poles={poles}
              onPoles={setPoles}
              inferred={{
                value: report && report.polePairs.source === 'inferred' ? report.polePairs.value : null,
                ambiguous: report?.polePairs.ambiguous ?? false,
                settledByChannel: report?.polePairs.settledByChannel ?? false,
                pattern: report?.polePairs.pattern ?? null,
                pending: findings.kind !== 'done',
              }}
            />
            {speedSaveError && (
              <p className="mt-2 text-xs text-danger" role="alert">
                {speedSaveError.message}
              </p>
            )}
          </BenchPanel>
        </div>

        <div className="@container flex min-w-0 flex-col gap-4 lg:col-start-2 lg:row-span-3 lg:row-start-1">
          <RecordingBar recording={recording} onClose={onClose} />
          <MapPanel
            settingsBar={<MapSettingsBar s={s} setup={setup} frames={header.frames} topDb={topDb} manualTop={manualTop} rangeOk={rangeOk} />}
            notices={notices}
            recordingName={recording.entry.name}
            layout={layout}
            status={status}
            onCancel={map.cancel}
            onRestart={map.restart}
            raster={raster}
            isTimeMap={against === 'time'}
            againstNote={againstNote}
            lut={lut}
            topDb={topDb}
            rangeDb={rangeDb}
            weighting={s.weighting}
            reference={reference}
            extents={extents}
            against={against}
            onAgainst={setAgainst}
            speedAvailable={frameRpm !== null}
            swapped={swapped}
            onSwap={() => setSwapped((w) => !w)}
            mode={mode}
            onMode={setMode}
            lines={lines}
            frameTimes={frameTimes}
            frameRpm={frameRpm}
            pinnedX={pinnedX}
            stores={stores}
            probe={probe}
            onPick={onPick}
            onPin={onPin}
            onZoom={zoom}
            marks={shownMarks}
            onMark={onMark}
            markTools={markTools}
            windowName={s.windowName}
            fsHz={fsHz}
          />
          <Dock
            recordingName={recording.entry.name}
            power={map.power}
            ready={done}
            layout={layout}
            lines={lines}
            against={against}
            frameTimes={frameTimes}
            frameRpm={frameRpm}
            rpmStep={rpmStep}
            speedRaster={speedRaster}
            windowName={s.windowName}
            enbwBins={enbwBins}
            weighting={s.weighting}
            reference={reference}
            topDb={topDb}
            rangeDb={rangeDb}
            stores={stores}
            pinnedTimeS={pinnedTimeS}
          />
        </div>

        <div className="flex flex-col gap-4 lg:col-start-1 lg:row-start-2 xl:col-start-3 xl:row-span-3 xl:row-start-1">
          <GuidesPanel
            guides={guides}
            dispatch={dispatch}
            detectedSummary={report && detectedHz ? carrierSummary(report) : null}
            canDetect={detectedHz !== null}
            onAddDetected={addDetectedCarrier}
            onAddTyped={addTyped}
            picking={mode === 'pick'}
            onPick={setPicking}
            speedAvailable={frameRpm !== null}
            polePairs={polePairs}
          />
          <FindingsPanel
            findings={findings}
            mapDone={done}
            speedKnown={frameRpm !== null}
            power={map.power}
            layout={layout}
            frameTimes={frameTimes}
            frameRpm={frameRpm}
            lines={lines}
            polePairs={polePairs}
            enbwBins={enbwBins}
            hann={s.windowName === 'hann'}
            reference={reference}
            soundPressure={channelSetup?.quantity === 'sound-pressure' && reference.label === '20 µPa'}
            stores={stores}
            pinnedTimeS={pinnedTimeS}
            onUnpin={unpin}
            onGo={goTo}
          />
        </div>
        <div className="lg:col-start-1 lg:row-start-3 xl:row-start-2">
          <BenchPanel title="Register with a project">
            <RegisterForm entry={recording.entry} setup={setup} preferredProjectId={preferredProjectId} />
          </BenchPanel>
          <div className="mt-4">
            <BenchPanel title="Save a view">
              <SaveViewForm
                entry={recording.entry}
                setup={setup}
                preferredProjectId={fromView?.view.projectId ?? preferredProjectId}
                capture={capture}
                marks={marks}
                fromView={fromView}
                onSaved={() => setMarks([])}
              />
            </BenchPanel>
          </div>
        </div>
      </div>
      {help && <ShortcutsDialog onClose={() => setHelp(false)} />}
    </BenchStoresContext.Provider>
  );
}

function RecordingBar({ recording, onClose }: { recording: OpenRecording; onClose: () => void }) {
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
    <section aria-label="Recording" className="flex flex-col gap-2 rounded-lg border border-ink-800 bg-ink-900 px-4 py-2.5">
      <div className="flex flex-wrap items-center gap-x-5 gap-y-1 text-xs text-mist-500">
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
