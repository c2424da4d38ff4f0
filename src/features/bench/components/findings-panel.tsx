import { memo, useMemo } from 'react';
import type { InverterReport } from '../../../../workers/dsp/inverter-analysis';
import type { StftLayout } from '../../../../workers/dsp/stft';
import type { TaskState } from '../hooks/use-analysis';
import type { MapPower } from '../hooks/use-map-computation';
import { carrierTonality, frameAt, frameAtRpm, type Tonality } from '../analysis/spectra';
import { familyDetail, familyLabel, lineHz, type GuideLine } from '../map/guides';
import type { LevelReference } from '../map/level-reference';
import type { BenchStores } from '../state/bench-stores';
import { useStore } from '../state/store';
import { BenchPanel } from './bench-panel';

/** "10 000" with a narrow no-break space between thousands. */
export const groupDigits = (v: number, decimals = 0) => {
  const [i, d] = Math.abs(v).toFixed(decimals).split('.');
  return `${v < 0 ? '−' : ''}${i.replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f')}${d ? `.${d}` : ''}`;
};

/** dB with one decimal, never "−0.0". */
const db1 = (v: number) => (Math.abs(v) < 0.05 ? '0.0' : v.toFixed(1));

export interface GoTo {
  /** The time to centre on (and pin); null for the whole run */
  timeS: number | null;
  /** The frequency span to show, Hz */
  fromHz: number;
  toHz: number;
}

const itemClass =
  'flex w-full flex-col items-start gap-0.5 rounded-md border border-ink-800 bg-ink-950/50 px-2.5 py-1.5 text-left text-xs transition-colors hover:border-accent/60 hover:bg-ink-850 focus-visible:border-accent';

function carrierLevels(r: InverterReport): number[] {
  if (r.carrierShifts.length) return [r.carrierShifts[0].fromHz, ...r.carrierShifts.map((s) => s.toHz)];
  const found = r.carrier.hz.filter((h) => Number.isFinite(h)).sort((a, b) => a - b);
  return found.length ? [found[found.length >> 1]] : [];
}

export function carrierSummary(r: InverterReport): string {
  const levels = carrierLevels(r);
  if (!levels.length) return 'No carrier found';
  return `Carrier ${levels.map((h) => `${groupDigits(h)} Hz`).join(', then ')}`;
}

export interface FindingsPanelProps {
  findings: TaskState<InverterReport>;
  mapDone: boolean;
  speedKnown: boolean;
  power: MapPower | null;
  layout: StftLayout | null;
  frameTimes: Float64Array | null;
  frameRpm: Float64Array | null;
  lines: GuideLine[];
  polePairs: number | null;
  enbwBins: number;
  hann: boolean;
  reference: LevelReference;
  soundPressure: boolean;
  stores: BenchStores;
  pinnedTimeS: number | null;
  onUnpin: () => void;
  onGo: (g: GoTo) => void;
}

export const FindingsPanel = memo(function FindingsPanel(p: FindingsPanelProps) {
  const { findings } = p;
  const r = findings.kind === 'done' ? findings.value : null;
  const dbOf = (rms: number) => 20 * Math.log10(rms / p.reference.refRms);

  return (
    <BenchPanel title="Findings" testId="findings-panel">
      <div className="flex flex-col gap-3 text-xs">
        {!p.mapDone && findings.kind === 'idle' && <p className="text-mist-500">The findings come once the map is complete.</p>}
        {(findings.kind === 'computing' || (findings.kind === 'done' && findings.stale)) && (
          <div className="flex flex-col gap-1.5">
            <p className="text-mist-300">{findings.kind === 'done' ? 'Updating the findings…' : 'Finding the carrier, its shifts and the pole pairs…'}</p>
            <div role="progressbar" aria-label="Finding the carrier" className="h-1.5 overflow-hidden rounded-full bg-ink-700">
              <div className="h-full w-1/3 animate-[fanlight-slide_1.4s_ease-in-out_infinite] rounded-full bg-accent" />
            </div>
          </div>
        )}
        {findings.kind === 'error' && <p className="text-danger">{findings.message}</p>}
        {r && (
          <>
            <section aria-label="Carrier" className="flex flex-col gap-1.5">
              <button
                type="button"
                className="text-left text-sm text-mist-100 hover:text-accent-strong disabled:hover:text-mist-100"
                data-testid="finding-carrier"
                disabled={carrierLevels(r).length === 0}
                title="Show the carrier over the whole run"
                onClick={() => {
                  const levels = carrierLevels(r);
                  p.onGo({ timeS: null, fromHz: Math.min(...levels) * 0.75, toHz: Math.max(...levels) * 1.25 });
                }}
              >
                {carrierSummary(r)}
              </button>
              <p className="text-mist-500">
                {r.carrierSpreadHz !== null ? (
                  <>
                    Spread carrier, about <span className="font-mono text-mist-100">{groupDigits(r.carrierSpreadHz)} Hz</span> wide.
                  </>
                ) : (
                  'Steady carrier (no spread).'
                )}
              </p>
              {r.carrierShifts.length > 0 && (
                <ul className="flex flex-col gap-1" aria-label="Carrier shifts">
                  {r.carrierShifts.map((s, i) => (
                    <li key={i}>
                      <button
                        type="button"
                        className={itemClass}
                        data-testid="finding-carrier-shift"
                        onClick={() => p.onGo({ timeS: s.t, fromHz: Math.min(s.fromHz, s.toHz) * 0.8, toHz: Math.max(s.fromHz, s.toHz) * 1.2 })}
                      >
                        <span className="text-mist-300">Carrier shift</span>
                        <span className="font-mono text-mist-100">
                          {groupDigits(s.fromHz)} → {groupDigits(s.toHz)} Hz
                        </span>
                        <span className="font-mono text-mist-500">
                          at {s.t.toFixed(2)} s{Number.isFinite(s.rpm) ? ` · ${groupDigits(s.rpm)} rpm` : ''}
                        </span>
                      </button>
                    </li>
                  ))}
                </ul>
              )}
            </section>
            <section aria-label="Pole pairs" className="border-t border-ink-800 pt-2.5" data-testid="finding-pole-pairs">
              <p className="text-mist-300">
                Pole pairs{' '}
                <span className="font-mono text-sm text-mist-100">{r.polePairs.value ?? '—'}</span>{' '}
                <span className="text-mist-500">
                  ({r.polePairs.source === 'given' ? 'typed' : 'inferred'}
                  {r.polePairs.ambiguous ? ', ambiguous' : ''})
                </span>
              </p>
              {r.polePairs.settledByChannel && (
                <p className="text-mist-500" data-testid="pole-pairs-settled">
                  The sidebands alone also fit {r.polePairs.pattern === 'm+n even' ? 'the voltage pattern' : 'the force pattern'}; the channel's quantity chose this one. Type the pole pairs if you know them.
                </p>
              )}
              <p className="text-mist-500">
                {r.polePairs.pattern
                  ? `Families follow m + n ${r.polePairs.pattern === 'm+n odd' ? 'odd (as in voltage and current)' : 'even (as in the force: vibration and sound)'}.`
                  : p.speedKnown
                    ? 'No family pattern stands out.'
                    : 'Set a speed source to infer the pole pairs and the families.'}
              </p>
            </section>
            {p.speedKnown && (
              <section aria-label="Strongest families" className="flex flex-col gap-1 border-t border-ink-800 pt-2.5">
                <p className="text-mist-300">Strongest families</p>
                <ul className="flex flex-col gap-1">
                  {r.strongestFamilies
                    .filter((f) => f.peakRms > 0 && Number.isFinite(f.peakRpm))
                    .slice(0, 5)
                    .map((f) => (
                      <li key={`${f.m}:${f.n}`}>
                        <button
                          type="button"
                          className={itemClass}
                          data-testid="finding-family"
                          onClick={() => {
                            const fam = r.families.find((x) => x.m === f.m && x.n === f.n);
                            const j = fam ? fam.rpm.indexOf(f.peakRpm) : -1;
                            const hz = fam && j >= 0 ? fam.hz[j] : NaN;
                            const frame = p.frameRpm ? frameAtRpm(p.frameRpm, f.peakRpm) : 0;
                            const t = p.frameTimes?.[frame] ?? 0;
                            if (Number.isFinite(hz)) p.onGo({ timeS: t, fromHz: hz - 1500, toHz: hz + 1500 });
                          }}
                        >
                          <span className="flex w-full items-baseline gap-2">
                            <span className="font-mono text-mist-100">{familyLabel(f.m, f.n, 'electrical')}</span>
                            <span className="font-mono text-mist-500">{familyDetail(f.m, f.n, 'electrical')}</span>
                            {f.explained === false && <span className="ml-auto text-mist-500">outside the pattern</span>}
                          </span>
                          <span className="font-mono text-mist-300">
                            peak {db1(dbOf(f.peakRms))} dB <span className="text-mist-500">re {p.reference.label}</span> at {groupDigits(f.peakRpm)} rpm
                          </span>
                        </button>
                      </li>
                    ))}
                </ul>
              </section>
            )}
          </>
        )}
        {p.power && p.layout && p.mapDone && <TonalityFinding {...p} report={r} />}
      </div>
    </BenchPanel>
  );
});

function TonalityFinding(p: FindingsPanelProps & { report: InverterReport | null }) {
  const pointer = useStore(p.stores.pointer);
  const layout = p.layout!;
  const power = p.power!;
  const pointed = pointer && Number.isFinite(pointer.timeS) ? pointer.timeS : null;
  const timeS = p.pinnedTimeS ?? pointed ?? layout.t0S + ((layout.frames - 1) * layout.hopS) / 2;
  const frame = frameAt(layout, timeS);
  const report = p.report;
  const result = useMemo((): Tonality | { timeS: number; none: string } => {
    const t = layout.t0S + frame * layout.hopS;
    const candidates: { label: string; hz: number }[] = [];
    // the carrier near that time: the median of the frames within ±0.5 s where it was found
    const near: number[] = [];
    if (report) {
      const reach = Math.round(0.5 / layout.hopS);
      for (let f = Math.max(0, frame - reach); f <= Math.min(layout.frames - 1, frame + reach); f++) if (Number.isFinite(report.carrier.hz[f])) near.push(report.carrier.hz[f]);
    }
    near.sort((a, b) => a - b);
    const fc = near.length ? near[near.length >> 1] : undefined;
    const fr = (p.frameRpm?.[frame] ?? NaN) / 60;
    if (fc !== undefined && Number.isFinite(fc)) {
      for (const m of [1, 2]) {
        for (let n = -5; n <= 5; n++) {
          if (n !== 0 && !(p.polePairs && fr > 0)) continue;
          candidates.push({ label: familyLabel(m, n, 'electrical'), hz: m * fc + n * (p.polePairs ?? 0) * fr });
        }
      }
    } else {
      for (const line of p.lines) if (line.kind === 'family') candidates.push({ label: line.label, hz: lineHz(line, frame) });
    }
    return carrierTonality(power.power, layout, power.frames, t, candidates, p.enbwBins, p.soundPressure ? p.reference.refRms : null);
  }, [frame, report, power, layout, p.frameRpm, p.polePairs, p.lines, p.enbwBins, p.soundPressure, p.reference.refRms]);

  const source = p.pinnedTimeS !== null ? 'pinned' : pointed !== null ? 'pointer' : 'middle of the run';
  return (
    <section aria-label="Tonality" className="flex flex-col gap-1.5 border-t border-ink-800 pt-2.5" data-testid="finding-tonality">
      <p className="flex items-baseline gap-2 text-mist-300">
        Tonality of the strongest carrier tone
        {p.pinnedTimeS !== null && (
          <button type="button" className="ml-auto rounded px-1.5 text-[11px] text-mist-500 hover:bg-ink-800 hover:text-mist-100" onClick={p.onUnpin}>
            unpin
          </button>
        )}
      </p>
      <p className="font-mono text-mist-500">
        at {(layout.t0S + frame * layout.hopS).toFixed(2)} s ({source}), ±0.5 s averaged
      </p>
      {'none' in result ? (
        <p className="text-mist-500">{result.none}</p>
      ) : (
        <button type="button" className={itemClass} onClick={() => p.onGo({ timeS: result.timeS, fromHz: result.toneHz - 1000, toHz: result.toneHz + 1000 })}>
          <span className="font-mono text-mist-100">
            {result.label} · {groupDigits(result.toneHz, 1)} Hz
          </span>
          {result.tnr && (
            <span className="font-mono text-mist-300">
              TNR {Number.isFinite(result.tnr.deltaLtDb) ? db1(result.tnr.deltaLtDb) : result.tnr.deltaLtDb > 0 ? '∞' : '−∞'} dB{' '}
              <span className="text-mist-500">(limit {db1(result.tnr.limitDb)})</span>{' '}
              {result.tnr.prominent ? <span className="text-accent">prominent</span> : <span className="text-mist-500">not prominent</span>}
            </span>
          )}
          {result.pr && (
            <span className="font-mono text-mist-300">
              PR {Number.isFinite(result.pr.deltaLpDb) ? db1(result.pr.deltaLpDb) : '—'} dB{' '}
              <span className="text-mist-500">(limit {db1(result.pr.limitDb)})</span>{' '}
              {result.pr.prominent ? <span className="text-accent">prominent</span> : <span className="text-mist-500">not prominent</span>}
            </span>
          )}
          {result.spl ? (
            <span className="font-mono text-mist-300">
              {result.spl.levelDb.toFixed(1)} dB SPL, {result.spl.audible ? 'above' : 'below'} the hearing threshold ({result.spl.thresholdDb.toFixed(1)} dB)
            </span>
          ) : (
            <span className="text-mist-500">The hearing threshold applies to sound-pressure channels in Pa.</span>
          )}
        </button>
      )}
      {!p.hann && <p className="text-mist-500">ECMA-418-1 asks for a Hann window; the map uses another.</p>}
    </section>
  );
}
