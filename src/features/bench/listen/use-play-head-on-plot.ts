import { useEffect, useRef } from 'react';
import type uPlot from 'uplot';
import { palette } from '../../../config/theme';
import { useBench } from '../session/bench-session';
import { useListenIfAny } from './listen-context';

/**
 * The play head on a plot against time or speed (the tracks): a thin line over the plot, moved
 * directly (no re-render, no redraw of the plot). Returns the callback to hand the chart to.
 */
export function usePlayHeadOnPlot(against: 'time' | 'speed'): (u: uPlot | null) => void {
  const listen = useListenIfAny();
  const runId = useBench((s) => s.recording.entry.fingerprint);
  const chart = useRef<{ u: uPlot; line: HTMLDivElement } | null>(null);
  const ctx = useRef({ against, runId });
  ctx.current = { against, runId };

  useEffect(() => {
    if (!listen) return;
    const move = () => {
      const c = chart.current;
      if (!c) return;
      const head = listen.playHead.get();
      const x = !head ? NaN : ctx.current.against === 'speed' ? head.rpm : head.runId === ctx.current.runId ? head.timeS : NaN;
      const left = Number.isFinite(x) ? c.u.valToPos(x, 'x') : NaN;
      const inside = Number.isFinite(left) && left >= 0 && left <= c.u.over.clientWidth;
      c.line.style.display = inside ? 'block' : 'none';
      if (inside) c.line.style.transform = `translateX(${left}px)`;
      c.line.dataset.x = inside ? String(x) : '';
    };
    return listen.playHead.subscribe(move);
  }, [listen]);

  return (u) => {
    if (!u) {
      chart.current = null;
      return;
    }
    const line = document.createElement('div');
    line.dataset.testid = 'plot-play-head';
    Object.assign(line.style, { position: 'absolute', top: '0', bottom: '0', left: '0', width: '2px', marginLeft: '-1px', background: palette.ok, pointerEvents: 'none', display: 'none' });
    u.over.appendChild(line);
    chart.current = { u, line };
  };
}
