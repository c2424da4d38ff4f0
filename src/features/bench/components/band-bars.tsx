import { useEffect, useRef, useState, type PointerEvent } from 'react';
import type { BandLevel } from '../analysis/spectra';
import { ticks } from '../../../lib/plot/axis-ticks';
import { palette, themeColour } from '../../../config/theme';
import { useThemeShown } from '../../../lib/theme-preference';

const labelled = new Set([31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000]);
const shortHz = (hz: number) => (hz >= 1000 ? `${hz / 1000}k` : String(hz));

/** Third-octave bars on a canvas, with a readout of the band under the pointer. */
export function BandBars({ bands, unit }: { bands: BandLevel[]; unit: string }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const [hover, setHover] = useState<number | null>(null);
  const geometry = useRef({ left: 0, barW: 0 });
  const theme = useThemeShown();

  useEffect(() => {
    const canvas = ref.current;
    if (!canvas) return;
    const draw = () => {
      const dpr = window.devicePixelRatio || 1;
      const W = Math.max(1, Math.round(canvas.clientWidth * dpr));
      const H = Math.max(1, Math.round(canvas.clientHeight * dpr));
      if (canvas.width !== W) canvas.width = W;
      if (canvas.height !== H) canvas.height = H;
      const ctx = canvas.getContext('2d')!;
      ctx.clearRect(0, 0, W, H);
      const values = bands.map((b) => b.db).filter((v): v is number => v !== null);
      if (!values.length) return;
      const top = Math.ceil(Math.max(...values) / 10) * 10;
      const floor = Math.min(top - 20, Math.floor((Math.min(...values) - 5) / 10) * 10);
      const left = 40 * dpr;
      const bottom = 18 * dpr;
      const plotH = H - bottom - 6 * dpr;
      const barW = (W - left) / bands.length;
      geometry.current = { left: left / dpr, barW: barW / dpr };
      const y = (v: number) => 6 * dpr + ((top - v) / (top - floor)) * plotH;
      ctx.font = `${11 * dpr}px "JetBrains Mono", ui-monospace, monospace`;
      ctx.fillStyle = themeColour((p) => p.mist[300]);
      ctx.textAlign = 'right';
      ctx.textBaseline = 'middle';
      ctx.strokeStyle = themeColour((p) => p.ink[800]);
      for (const v of ticks(floor, top, 5)) {
        ctx.beginPath();
        ctx.moveTo(left, Math.round(y(v)) + 0.5);
        ctx.lineTo(W, Math.round(y(v)) + 0.5);
        ctx.stroke();
        ctx.fillText(String(v), left - 6 * dpr, y(v));
      }
      ctx.textAlign = 'center';
      ctx.textBaseline = 'top';
      bands.forEach((b, i) => {
        const x = left + i * barW;
        if (b.db !== null) {
          ctx.fillStyle = i === hover ? palette.accent.DEFAULT : palette.guide.level;
          const yv = Math.max(6 * dpr, y(b.db));
          ctx.fillRect(x + barW * 0.14, yv, barW * 0.72, 6 * dpr + plotH - yv);
        }
        if (labelled.has(b.nominalHz)) {
          ctx.fillStyle = themeColour((p) => p.mist[500]);
          ctx.fillText(shortHz(b.nominalHz), x + barW / 2, H - bottom + 4 * dpr);
        }
      });
    };
    draw();
    const observer = new ResizeObserver(draw);
    observer.observe(canvas);
    return () => observer.disconnect();
  }, [bands, hover, theme]);

  const onMove = (e: PointerEvent<HTMLCanvasElement>) => {
    const rect = e.currentTarget.getBoundingClientRect();
    const { left, barW } = geometry.current;
    const i = Math.floor((e.clientX - rect.left - left) / Math.max(1, barW));
    setHover(i >= 0 && i < bands.length ? i : null);
  };
  const h = hover !== null ? bands[hover] : null;
  return (
    <div className="relative h-full">
      <canvas ref={ref} className="block h-full w-full" role="img" aria-label={`Third-octave band levels in ${unit}`} data-testid="bands-canvas" onPointerMove={onMove} onPointerLeave={() => setHover(null)} />
      <p className="pointer-events-none absolute right-1 top-0 font-mono text-[11px] text-mist-300">
        {h ? `${shortHz(h.nominalHz)}Hz ${h.db === null ? '—' : h.db.toFixed(1)} ${unit.split(' ')[0]}` : ''}
      </p>
    </div>
  );
}

