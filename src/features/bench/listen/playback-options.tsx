import { useState } from 'react';
import { writeWav } from '../../../../workers/io/wav-writer';
import { downloadBlob } from '../analysis/export';
import { smallInputClass, smallSelectClass, toolButtonClass } from '../components/bench-panel';
import { useBench, useBenchLive } from '../session/bench-session';
import { useStore } from '../session/store';
import { useListen } from './listen-context';
import type { Loop } from './listen-controller';

const RATES = [0.25, 0.5, 1, 2];
const BANDWIDTHS_HZ = [5, 10, 20, 50];

/** What is heard: the channel, the processing of the ticked guides, the rate, the loop and the gain; and the export. */
export function PlaybackOptions() {
  const listen = useListen();
  const s = useStore(listen.settings);
  const status = useStore(listen.status);
  const setup = useBench((st) => st.setup);
  const selectedCount = useBench((st) => st.selected.length);
  const [exporting, setExporting] = useState<string | null>(null);

  const exportWav = async () => {
    setExporting('Processing…');
    try {
      const out = await listen.processedForExport();
      if (!out) return setExporting('Tick guides and choose a processing to export.');
      downloadBlob(new Blob([writeWav([out.samples], { sampleRateHz: out.fsHz, bits: 32, float: true }) as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }), out.name);
      setExporting(null);
    } catch (e) {
      setExporting(`The export failed: ${e instanceof Error ? e.message : String(e)}`);
    }
  };

  const label = 'flex items-center gap-1.5 text-[11px] text-mist-500';
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
      <label className={label}>
        Channel
        <select aria-label="Channel heard" className={smallSelectClass} value={s.channel ?? ''} onChange={(e) => listen.update({ channel: e.target.value === '' ? null : Number(e.target.value) })}>
          <option value="">The map&apos;s</option>
          {setup.map((c) => (
            <option key={c.index} value={c.index}>
              {c.name} ({c.unit || 'no unit'})
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Ticked guides
        <select
          aria-label="Ticked guides"
          className={smallSelectClass}
          value={s.processing}
          onChange={(e) => listen.update({ processing: e.target.value as typeof s.processing, hearing: e.target.value === 'off' ? 'original' : 'processed' })}
        >
          <option value="off">As recorded</option>
          <option value="isolate">Alone</option>
          <option value="remove">Taken out</option>
        </select>
      </label>
      <label className={label} title="The −3 dB bandwidth of the Vold–Kalman filter that follows each guide">
        Bandwidth
        <select aria-label="Filter bandwidth" className={smallSelectClass} value={s.bandwidthHz} onChange={(e) => listen.update({ bandwidthHz: Number(e.target.value) })}>
          {BANDWIDTHS_HZ.map((b) => (
            <option key={b} value={b}>
              {b} Hz
            </option>
          ))}
        </select>
      </label>
      <label className={label} title="Playing slower or faster changes the pitch too">
        Rate
        <select aria-label="Playback rate" className={smallSelectClass} value={s.rate} onChange={(e) => listen.update({ rate: Number(e.target.value) })}>
          {RATES.map((r) => (
            <option key={r} value={r}>
              {r}×
            </option>
          ))}
        </select>
      </label>
      <LoopChoice />
      <label className={label}>
        Gain
        <input
          type="range"
          aria-label="Playback gain"
          min={-60}
          max={12}
          step={1}
          value={s.gainDb}
          aria-valuetext={`${s.gainDb} dB`}
          className="w-24 accent-accent"
          onChange={(e) => listen.update({ gainDb: Number(e.target.value) })}
        />
        <span className="w-12 font-mono text-mist-100">{s.gainDb > 0 ? `+${s.gainDb}` : s.gainDb.toString().replace('-', '−')} dB</span>
      </label>
      {status.heard && (
        <span className="text-[11px] text-mist-500" data-testid="playback-level">
          {status.heard.level}
        </span>
      )}
      <button type="button" className={toolButtonClass()} disabled={s.processing === 'off' || selectedCount === 0 || exporting === 'Processing…'} onClick={exportWav}>
        Export WAV
      </button>
      {exporting && <span className="text-[11px] text-mist-300">{exporting}</span>}
    </div>
  );
}

/** Loop nothing, the map's visible span, a box mark, or a speed range. */
function LoopChoice() {
  const listen = useListen();
  const loop = useStore(listen.settings).loop;
  const live = useBenchLive();
  const against = useBench((st) => st.against);
  const marks = useBench((st) => st.shownMarks);
  const boxes = marks.flatMap((m, i) => (m.kind === 'box' ? [{ m, n: m.number ?? i + 1 }] : []));
  const [rpmText, setRpmText] = useState(['', '']);
  const [choice, setChoice] = useState('off');

  const spanLoop = (x0: number, x1: number, label: string): Loop =>
    against === 'time' ? { kind: 'time', t0S: Math.min(x0, x1), t1S: Math.max(x0, x1), label } : { kind: 'speed', rpm0: Math.min(x0, x1), rpm1: Math.max(x0, x1), label };

  const choose = (value: string) => {
    setChoice(value);
    if (value === 'off') return listen.update({ loop: null });
    if (value === 'view') {
      const v = live.viewport.get();
      return listen.update({ loop: v ? spanLoop(Math.max(0, v.x[0]), v.x[1], 'the visible span') : null });
    }
    if (value === 'speed') return applySpeed(rpmText);
    const box = boxes.find((b) => `mark:${b.n}` === value);
    if (box && box.m.kind === 'box') listen.update({ loop: spanLoop(box.m.x0, box.m.x1, `box ${box.n}`) });
  };
  const applySpeed = (text: string[]) => {
    const [a, b] = text.map(Number);
    listen.update({ loop: text.every((t) => t.trim() !== '') && a > 0 && b > 0 && a !== b ? { kind: 'speed', rpm0: a, rpm1: b, label: `${a}–${b} rpm` } : null });
  };

  return (
    <span className="flex items-center gap-1.5 text-[11px] text-mist-500">
      <label className="flex items-center gap-1.5">
        Loop
        <select aria-label="Loop" className={smallSelectClass} value={loop ? choice : 'off'} onChange={(e) => choose(e.target.value)}>
          <option value="off">Off</option>
          <option value="view">The visible span</option>
          {boxes.map((b) => (
            <option key={b.n} value={`mark:${b.n}`}>
              Box {b.n}
            </option>
          ))}
          <option value="speed">A speed range</option>
        </select>
      </label>
      {choice === 'speed' &&
        (['from', 'to'] as const).map((end, i) => (
          <input
            key={end}
            aria-label={`Loop ${end} rpm`}
            inputMode="decimal"
            className={`${smallInputClass()} w-16`}
            placeholder="rpm"
            value={rpmText[i]}
            onChange={(e) => {
              const next = [...rpmText];
              next[i] = e.target.value;
              setRpmText(next);
              applySpeed(next);
            }}
          />
        ))}
    </span>
  );
}
