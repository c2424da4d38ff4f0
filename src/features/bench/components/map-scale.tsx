import { lutCss } from '../../../lib/plot/colour-scales';
import { ticks } from '../../../lib/plot/axis-ticks';

/** The colour bar beside the map: the lookup from floor to top, with levels in dB against the reference. */
export function MapScale({
  lut,
  topDb,
  rangeDb,
  reference,
  unit,
  weighting,
  heightClass,
}: {
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  reference: string;
  unit: string;
  weighting: 'A' | 'C' | 'Z';
  /** The map's height, so bar and map line up */
  heightClass: string;
}) {
  const stops = Array.from({ length: 17 }, (_, i) => `${lutCss(lut, Math.round((i * 255) / 16))} ${(i * 100) / 16}%`);
  const floorDb = topDb - rangeDb;
  const values = ticks(floorDb, topDb, 7);
  return (
    <div className="flex w-24 shrink-0 flex-col pl-3" data-testid="map-scale">
      <p className="flex h-7 items-end pb-1 text-[11px] leading-tight text-mist-300">
        <span>
          <span className="font-mono text-mist-100">{weighting === 'Z' ? 'dB' : `dB(${weighting})`}</span>{' '}
          <span className="text-mist-500">re</span> <span className="font-mono">{reference}</span>
        </span>
      </p>
      <div className={`flex gap-1.5 ${heightClass}`}>
        <div
          className="w-3 rounded-sm ring-1 ring-ink-700"
          style={{ background: `linear-gradient(to top, ${stops.join(', ')})` }}
          aria-hidden
        />
        <div className="relative flex-1">
          {values.map((v) => (
            <span
              key={v}
              className="absolute left-0 flex -translate-y-1/2 items-center gap-1 font-mono text-[11px] leading-none text-mist-300"
              style={{ top: `${((topDb - v) / rangeDb) * 100}%` }}
            >
              <span className="h-px w-1 bg-ink-600" />
              {Number.isInteger(v) ? v : v.toFixed(1)}
            </span>
          ))}
        </div>
      </div>
      <p className="mt-2 text-xs text-mist-500">
        {unit ? (
          <>
            signal in <span className="font-mono text-mist-300">{unit}</span>
          </>
        ) : (
          'signal in file units'
        )}
      </p>
    </div>
  );
}
