import { memo } from 'react';
import { familyDetail, familyLabel } from '../../../../workers/dsp/guide-formula';
import { db1 } from '../../../lib/tone-text';
import { carrierLevels, carrierSummary, groupDigits } from '../analysis/findings-text';
import { frameAtRpm } from '../analysis/spectra';
import { useBench, useBenchActions } from '../session/bench-session';
import { BenchPanel } from './bench-panel';
import { itemClass, TonalityFinding } from './tonality-finding';

/** What the session found: the carrier and its shifts, spread, pole pairs and pattern, the strongest families, the tonality. */
export const FindingsPanel = memo(function FindingsPanel() {
  const a = useBenchActions();
  const findings = useBench((s) => s.findings);
  const mapDone = useBench((s) => s.map.done);
  const speedKnown = useBench((s) => s.frameRpm !== null);
  const frameRpm = useBench((s) => s.frameRpm);
  const frameTimes = useBench((s) => s.frameTimes);
  const reference = useBench((s) => s.reference);
  const r = findings.kind === 'done' ? findings.value : null;
  const dbOf = (rms: number) => 20 * Math.log10(rms / reference.refRms);

  return (
    <BenchPanel title="Findings" testId="findings-panel">
      <div className="flex flex-col gap-3 text-xs">
        {!mapDone && findings.kind === 'idle' && <p className="text-mist-500">The findings come once the map is complete.</p>}
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
                  a.goTo({ timeS: null, fromHz: Math.min(...levels) * 0.75, toHz: Math.max(...levels) * 1.25 });
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
                        onClick={() => a.goTo({ timeS: s.t, fromHz: Math.min(s.fromHz, s.toHz) * 0.8, toHz: Math.max(s.fromHz, s.toHz) * 1.2 })}
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
                  : speedKnown
                    ? 'No family pattern stands out.'
                    : 'Set a speed source to infer the pole pairs and the families.'}
              </p>
            </section>
            {speedKnown && (
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
                            const frame = frameRpm ? frameAtRpm(frameRpm, f.peakRpm) : 0;
                            const t = frameTimes?.[frame] ?? 0;
                            if (Number.isFinite(hz)) a.goTo({ timeS: t, fromHz: hz - 1500, toHz: hz + 1500 });
                          }}
                        >
                          <span className="flex w-full items-baseline gap-2">
                            <span className="font-mono text-mist-100">{familyLabel(f.m, f.n, 'electrical')}</span>
                            <span className="font-mono text-mist-500">{familyDetail(f.m, f.n, 'electrical')}</span>
                            {f.explained === false && <span className="ml-auto text-mist-500">outside the pattern</span>}
                          </span>
                          <span className="font-mono text-mist-300">
                            peak {db1(dbOf(f.peakRms))} dB <span className="text-mist-500">re {reference.label}</span> at {groupDigits(f.peakRpm)} rpm
                          </span>
                        </button>
                      </li>
                    ))}
                </ul>
              </section>
            )}
          </>
        )}
        {mapDone && <TonalityFinding />}
      </div>
    </BenchPanel>
  );
});

