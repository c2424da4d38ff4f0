import { useMemo } from 'react';
import { familyLabel } from '../../../../workers/dsp/guide-formula';
import { db1 } from '../../../lib/tone-text';
import { groupDigits } from '../analysis/findings-text';
import { frameAt } from '../analysis/spectra';
import { useBench, useBenchActions, useBenchLive } from '../session/bench-session';
import { useStore } from '../session/store';

export const itemClass =
  'flex w-full flex-col items-start gap-0.5 rounded-md border border-ink-800 bg-ink-950/50 px-2.5 py-1.5 text-left text-xs transition-colors hover:border-accent/60 hover:bg-ink-850 focus-visible:border-accent';

/**
 * The carrier tones' tonality (ECMA-418-1, and for sound pressure ISO/TS 20065 audibility, also above
 * 11.2 kHz; carrierTonality as the batch CLI runs it): at the pinned
 * moment, else under the pointer, else where the strongest family peaks (the findings' own moment).
 */
export function TonalityFinding() {
  const a = useBenchActions();
  const pointer = useStore(useBenchLive().pointer);
  const layout = useBench((s) => s.map.layout);
  const report = useBench((s) => s.report);
  const pinnedTimeS = useBench((s) => s.pinnedTimeS);
  const tonalityAt = useBench((s) => s.tonalityAt);
  const hann = useBench((s) => s.settings.windowName === 'hann');
  const soundPressure = useBench((s) => s.soundPressure);
  const pointed = pointer && Number.isFinite(pointer.timeS) ? pointer.timeS : null;
  const asked = pinnedTimeS ?? pointed;
  const frame = layout && asked !== null ? frameAt(layout, asked) : null;
  const result = useMemo(() => {
    if (frame === null || !layout) return report ? report.tonality : null;
    return tonalityAt(layout.t0S + frame * layout.hopS);
  }, [frame, layout, report, tonalityAt]);
  if (!layout) return null;

  const source = pinnedTimeS !== null ? 'pinned' : pointed !== null ? 'pointer' : 'where the strongest family peaks';
  return (
    <section aria-label="Tonality" className="flex flex-col gap-1.5 border-t border-ink-800 pt-2.5" data-testid="finding-tonality">
      <p className="flex items-baseline gap-2 text-mist-300">
        Tonality of the carrier tones
        {pinnedTimeS !== null && (
          <button type="button" className="ml-auto rounded px-1.5 text-[11px] text-mist-500 hover:bg-ink-800 hover:text-mist-100" onClick={a.unpin}>
            unpin
          </button>
        )}
      </p>
      {!result ? (
        <p className="text-mist-500">The tonality comes with the findings.</p>
      ) : (
        <>
          <p className="font-mono text-mist-500">
            at {result.atS.toFixed(2)} s ({source}), ±0.5 s averaged
          </p>
          {result.tones.length === 0 && <p className="text-mist-500">No carrier tone to judge there (ECMA-418-1 takes 89.1 Hz–11.2 kHz; above it, sound pressure is judged by its audibility).</p>}
          <ul className="flex flex-col gap-1" data-testid="tonality-tones">
            {result.tones.map((t) => (
              <li key={`${t.m}:${t.n}`}>
                <button type="button" className={itemClass} onClick={() => a.goTo({ timeS: result.atS, fromHz: t.hz - 1000, toHz: t.hz + 1000 })}>
                  <span className="font-mono text-mist-100">
                    {familyLabel(t.m, t.n)} · {groupDigits(t.hz, 1)} Hz
                  </span>
                  {t.tnrDb !== null && t.prDb !== null ? (
                    <span className="font-mono text-mist-300" data-testid="tone-tnr">
                      TNR {db1(t.tnrDb)} dB <span className="text-mist-500">(limit {db1(t.tnrLimitDb ?? NaN)})</span> · PR {db1(t.prDb)} dB{' '}
                      <span className="text-mist-500">(limit {db1(t.prLimitDb ?? NaN)})</span>{' '}
                      {t.prominent ? <span className="text-accent">prominent</span> : <span className="text-mist-500">not prominent</span>}
                    </span>
                  ) : (
                    <span className="font-mono text-mist-500" data-testid="tone-tnr-out-of-range" title="ECMA-418-1 defines TNR and PR from 89.1 Hz to 11.2 kHz">
                      TNR, PR: not defined above 11.2 kHz
                    </span>
                  )}
                  {t.levelDb !== null && t.aboveThresholdDb !== null && (
                    <span className="font-mono text-mist-300">
                      {db1(t.levelDb)} dB SPL, {db1(Math.abs(t.aboveThresholdDb))} dB {t.aboveThresholdDb >= 0 ? 'above' : 'below'} the hearing threshold
                    </span>
                  )}
                  {t.audibilityDb !== null && (
                    <span className="font-mono text-mist-300" data-testid="tone-audibility">
                      audibility {db1(t.audibilityDb)} dB{' '}
                      <span className="text-mist-500">{t.audibilityDb > 0 ? 'over the masking noise' : 'under the masking noise'} (ISO/TS 20065)</span>
                    </span>
                  )}
                </button>
              </li>
            ))}
          </ul>
          {!soundPressure && <p className="text-mist-500">The hearing threshold applies to sound-pressure channels in Pa.</p>}
        </>
      )}
      {!hann && <p className="text-mist-500">ECMA-418-1 asks for a Hann window; the map uses another.</p>}
    </section>
  );
}
