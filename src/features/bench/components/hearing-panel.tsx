import { memo, useMemo } from 'react';
import { speedAtTimes } from '../../../../workers/dsp/hearing-curves';
import { loudnessLevelPhon } from '../../../../workers/dsp/loudness';
import { baseName, csvText, downloadCsv, round } from '../analysis/export';
import { groupDigits } from '../analysis/findings-text';
import { useBench, useBenchActions } from '../session/bench-session';
import type { TaskState } from '../session/use-analysis-tasks';
import { BenchPanel, smallSelectClass, toolButtonClass } from './bench-panel';
import { CsvButton, useDockInputs } from './dock-inputs';
import { HearingChart } from './hearing-chart';
import { SERIES_COLOURS } from './uplot-chart';

const waiting = (s: TaskState<unknown>, what: string) =>
  s.kind === 'computing' ? `Computing ${what}…` : s.kind === 'error' ? s.message : null;

/**
 * Is the whine audible, and how loud is the run: the loudness (ISO 532-1, Zwicker) and the tonality
 * (ECMA-418-2, the hearing model) of a sound-pressure channel against time or speed, computed in
 * workers when asked. The strongest tonal frequency can be drawn on the map.
 */
export const HearingPanel = memo(function HearingPanel() {
  const p = useDockInputs();
  const a = useBenchActions();
  const hearing = useBench((s) => s.hearing);
  const soundPressure = useBench((s) => s.soundPressure);
  const tonalOnMap = useBench((s) => s.tonalOnMap);
  const { loudness, tonality } = hearing;
  const loud = loudness.kind === 'done' ? loudness.value : null;
  const tonal = tonality.kind === 'done' ? tonality.value : null;
  const loudSeries = useMemo(() => (loud ? { t: loud.t, v: loud.sone } : null), [loud]);
  const tonalSeries = useMemo(() => (tonal ? { t: tonal.t, v: tonal.tu } : null), [tonal]);

  const exportCsv = () => {
    const rows: (string | number | null)[][] = [];
    const rpmOf = (t: Float64Array) => (p.frameTimes && p.frameRpm ? speedAtTimes(t, p.frameTimes, p.frameRpm) : null);
    if (loud) {
      const rpm = rpmOf(loud.t);
      loud.t.forEach((t, i) => rows.push(['loudness (sone)', round(t, 4), rpm ? round(rpm[i], 1) : null, round(loud.sone[i], 3), null]));
    }
    if (tonal) {
      const rpm = rpmOf(tonal.t);
      tonal.t.forEach((t, i) => rows.push(['tonality (tu_HMS)', round(t, 4), rpm ? round(rpm[i], 1) : null, round(tonal.tu[i], 3), Number.isFinite(tonal.tonalHz[i]) ? round(tonal.tonalHz[i], 1) : null]));
    }
    downloadCsv(csvText(['figure', 'time (s)', 'speed (rpm)', 'value', 'tonal frequency (Hz)'], rows), `${baseName(p.recordingName)}-hearing.csv`);
  };

  return (
    <BenchPanel title="Hearing" testId="hearing-panel" actions={<CsvButton testId="export-hearing-csv" disabled={!loud && !tonal} onClick={exportCsv} />}>
      {!soundPressure ? (
        <p className="text-xs text-mist-500">
          Loudness and tonality are judged on a sound-pressure channel in Pa: set the map channel&apos;s quantity to sound pressure, with its
          calibration, under Channels and speed.
        </p>
      ) : !hearing.asked ? (
        <div className="flex flex-wrap items-center gap-2 text-xs text-mist-300">
          <label className="flex items-center gap-1.5">
            Sound field
            <select aria-label="Sound field" className={smallSelectClass} value={hearing.field} onChange={(e) => a.setHearingField(e.target.value as 'free' | 'diffuse')}>
              <option value="free">free</option>
              <option value="diffuse">diffuse</option>
            </select>
          </label>
          <button type="button" className={toolButtonClass()} onClick={a.askHearing}>
            Compute loudness and tonality
          </button>
          <span className="text-mist-500">ISO 532-1 and ECMA-418-2, in the background; a minute of sound takes a few tens of seconds.</span>
        </div>
      ) : (
        <div className="flex flex-col gap-3 text-xs">
          <section aria-label="Loudness" className="flex flex-col gap-1">
            <p className="flex flex-wrap items-baseline gap-x-3 text-mist-300">
              <span>Loudness (ISO 532-1, {hearing.field} field)</span>
              {loud && (
                <span className="font-mono text-mist-100" data-testid="loudness-n5">
                  N5 {groupDigits(loud.n5Sone, 2)} sone ({groupDigits(loudnessLevelPhon(loud.n5Sone), 1)} phon), max {groupDigits(loud.maxSone, 2)} sone
                </span>
              )}
              <select aria-label="Sound field" className={`${smallSelectClass} ml-auto`} value={hearing.field} onChange={(e) => a.setHearingField(e.target.value as 'free' | 'diffuse')}>
                <option value="free">free field</option>
                <option value="diffuse">diffuse field</option>
              </select>
            </p>
            {loudSeries ? (
              <HearingChart series={loudSeries} unit="sone" label="Loudness" testId="loudness-plot" against={p.against} frameTimes={p.frameTimes} frameRpm={p.frameRpm} stores={p.stores} />
            ) : (
              <p className="text-mist-500">{waiting(loudness, 'the loudness')}</p>
            )}
          </section>
          <section aria-label="Tonality of the hearing model" className="flex flex-col gap-1">
            <p className="flex flex-wrap items-baseline gap-x-3 text-mist-300">
              <span>Tonality (ECMA-418-2)</span>
              {tonal && (
                <span className="font-mono text-mist-100" data-testid="tonality-average">
                  {groupDigits(tonal.averageTu, 2)} tu_HMS on average
                  {Number.isFinite(tonal.averageTonalHz) ? `, at ${groupDigits(tonal.averageTonalHz, 0)} Hz` : ''}
                </span>
              )}
              {tonal && (
                <label className="ml-auto flex items-center gap-1.5 text-mist-300">
                  <input type="checkbox" checked={tonalOnMap} onChange={(e) => a.showTonalOnMap(e.target.checked)} />
                  tonal frequency on the map
                </label>
              )}
            </p>
            {tonalSeries ? (
              <HearingChart series={tonalSeries} unit="tu_HMS" label="Tonality" testId="tonality-plot" against={p.against} frameTimes={p.frameTimes} frameRpm={p.frameRpm} stores={p.stores} colour={SERIES_COLOURS[1]} />
            ) : (
              <p className="text-mist-500">{waiting(tonality, 'the tonality')}</p>
            )}
          </section>
          <p className="text-mist-500">
            Aids to judgement, not verdicts: the figures hold for the calibrated microphone where it stood, and whether a whine is acceptable is
            decided by listening and by the limits that apply to the product.
          </p>
        </div>
      )}
    </BenchPanel>
  );
});
