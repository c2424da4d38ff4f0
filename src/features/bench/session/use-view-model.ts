import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { GuideRef } from '../../../../server/schemas/views';
import { MAIN_LOBE_HALF_BINS } from '../../../../workers/dsp/inverter-analysis';
import { peakNear } from '../../../../workers/dsp/peak';
import type { WindowName } from '../../../../workers/dsp/window';
import type { StftLayout } from '../../../../workers/dsp/stft';
import { frameAt, frameAtRpm } from '../analysis/spectra';
import { defaultFamilies, type GuidesAction } from '../map/guides';
import type { MapRaster } from '../map/map-raster';
import { centreOf, clampViewport, fullView, zoomAbout, type Extents, type Viewport } from '../map/viewport';
import type { ViewOnBench } from '../view-state/view-restore';
import type { BenchMark } from '../view-state/view-snapshot';
import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';
import type { BenchPointer, BenchStores } from './live-stores';
import type { MapPower } from './use-map-computation';
import { useSavedMarksOnMap } from './use-saved-marks';

export type MapMode = 'pan' | 'box' | 'pick' | 'mark';

/** Where a mark is placed on the map, in its axes (x: time or speed) */
export type MarkPlace = { kind: 'point'; x: number; f: number } | { kind: 'box'; x0: number; x1: number; f0: number; f1: number };

/** A finding's place to show: a moment (pinned) and a frequency span. */
export interface GoTo {
  /** The time to centre on (and pin); null for the whole run */
  timeS: number | null;
  fromHz: number;
  toHz: number;
}

export interface ViewInputs {
  live: BenchStores;
  fromView: ViewOnBench | undefined;
  raster: MapRaster | null;
  layout: StftLayout | null;
  power: MapPower | null;
  extents: Extents | null;
  against: 'time' | 'speed';
  frameRpm: Float64Array | null;
  rpmStep: number;
  windowName: WindowName;
  report: InverterReport | null;
  detectedHz: Float64Array | null;
  dispatchGuides: (a: GuidesAction) => void;
  /** Following another session: its swap, and its zoom (which this one leaves alone) */
  follow?: { swapped: boolean };
}

/**
 * How the engineer looks at the map: the zoom (a live store), the axes swapped or not, the pointer mode,
 * a pinned moment, the marks placed and not yet saved, and a note on what a gesture did.
 */
export function useViewModel(inp: ViewInputs) {
  const { live, fromView, raster, layout, power, extents, against, frameRpm, rpmStep, windowName, report, detectedHz, dispatchGuides, follow } = inp;
  const restore = fromView?.restore;
  const following = follow !== undefined;

  // Another map of the same span (a new window, colours, calibration) keeps the view; another span starts
  // whole. A saved view's zoom waits for the first map against the same axis (speed comes after time).
  const extentsKey = extents ? `${against}:${extents.x.join(',')}:${extents.f.join(',')}` : '';
  const viewKey = useRef('');
  const savedZoom = useRef(restore?.viewport ?? null);
  const latest = useRef({ extents, against });
  latest.current = { extents, against };
  useEffect(() => {
    if (following) return;
    const { extents: e, against: a } = latest.current;
    if (!e) {
      live.viewport.set(null);
      viewKey.current = '';
      return;
    }
    const v = live.viewport.get();
    const zoom = savedZoom.current && a === restore?.against ? savedZoom.current : null;
    if (zoom) savedZoom.current = null;
    live.viewport.set(zoom ? clampViewport(zoom, e) : v && viewKey.current === extentsKey ? clampViewport(v, e) : fullView(e));
    viewKey.current = extentsKey;
  }, [extentsKey, live, restore?.against, following]);
  const setView = useCallback(
    (f: (e: Extents) => Viewport) => {
      if (extents) live.viewport.set(f(extents));
    },
    [extents, live],
  );

  const [ownSwapped, setSwapped] = useState(restore?.swapped ?? false);
  const swapped = follow?.swapped ?? ownSwapped;
  const [mode, setMode] = useState<MapMode>('pan');
  const [pinnedTimeS, setPinnedTimeS] = useState<number | null>(null);
  const [help, setHelp] = useState(false);
  const [note, setNote] = useState<string | null>(null);

  // Marks placed on the map, kept until the view is saved
  const [marks, setMarks] = useState<BenchMark[]>([]);
  const [markText, setMarkText] = useState('');
  const nextMarkId = useRef(1);
  const addMark = useCallback(
    (place: MarkPlace | { kind: 'guide'; guide: GuideRef; label: string }) => {
      const id = nextMarkId.current++;
      setMarks((ms) => [...ms, { ...place, id, text: markText.trim() } as BenchMark]);
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
      const [X0, X1] = raster.xSpan;
      const [F0, F1] = raster.frequencySpanHz;
      const hit = raster.probe((x - X0) / (X1 - X0), (f - F0) / (F1 - F0));
      if (!hit) return null;
      const column = Math.min(raster.columns - 1, Math.floor(((x - X0) / (X1 - X0)) * raster.columns));
      if (against === 'speed' && frameRpm) {
        const frame = frameAtRpm(frameRpm, hit.x);
        return { x, f, timeS: layout.t0S + frame * layout.hopS, rpm: hit.x, levelDb: hit.levelDb, frame, column, from: 'map' };
      }
      const frame = frameAt(layout, hit.x);
      return { x, f, timeS: hit.x, rpm: frameRpm?.[frame] ?? NaN, levelDb: hit.levelDb, frame, column, from: 'map' };
    },
    [raster, layout, against, frameRpm],
  );

  const addCarrierAt = useCallback(
    (hz: number, source: 'typed' | 'detected') =>
      dispatchGuides({ type: 'add-carrier', source, centreHz: Math.round(hz), families: defaultFamilies(report && !report.polePairs.ambiguous ? report.polePairs.pattern : null) }),
    [report, dispatchGuides],
  );
  // A picked centre snaps to the line nearest the click, between bins (peakNear): within a
  // main lobe or two, or about a hundredth of the visible frequency span (a few pixels), the wider.
  const pick = useCallback(
    (fHz: number) => {
      const bin = layout?.binHz ?? 1;
      let centre = Math.round(fHz / bin) * bin;
      const at = live.pointer.get();
      if (power && at && at.frame >= 0 && at.frame < power.frames) {
        const bins = power.layout.bins;
        const row = power.power.subarray(at.frame * bins, (at.frame + 1) * bins);
        const view = live.viewport.get();
        const reach = Math.max(2 * MAIN_LOBE_HALF_BINS[windowName], view ? (0.012 * (view.f[1] - view.f[0])) / bin : 0);
        const peak = peakNear(row, fHz / bin, reach);
        if (peak) {
          centre = peak.bin * bin;
          setNote(`The carrier guide snapped to the line at ${Math.round(centre)} Hz nearest the click (${Math.round(fHz)} Hz); type another centre in the guide if you meant another.`);
        }
      }
      addCarrierAt(centre, 'typed');
      setMode('pan');
    },
    [addCarrierAt, layout, live, power, windowName],
  );
  const addDetectedCarrier = useCallback(() => {
    if (!detectedHz) {
      setNote('The carrier has not been found yet: wait for the findings, or type a centre.');
      return;
    }
    setNote(null);
    const found = [...detectedHz].filter(Number.isFinite).sort((a, b) => a - b);
    addCarrierAt(found[found.length >> 1], 'detected');
  }, [detectedHz, addCarrierAt]);

  const pin = useCallback(
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
      const v = live.viewport.get();
      if (!v) return;
      const ptr = live.pointer.get();
      const about = ptr && ptr.from === 'map' ? { x: ptr.x, f: ptr.f } : centreOf(v);
      setView((e) => zoomAbout(v, e, factor, about));
    },
    [live, setView],
  );

  return {
    state: { swapped, mode, pinnedTimeS, pinnedX, help, note, marks, markText, savedMarks, firstPending, shownMarks },
    actions: {
      setView,
      setSwapped,
      setMode,
      setHelp,
      setNote,
      pin,
      unpin: () => setPinnedTimeS(null),
      goTo,
      zoom,
      probe,
      pick,
      addCarrierAt,
      addDetectedCarrier,
      addMark,
      setMarks,
      setMarkText,
    },
  };
}
