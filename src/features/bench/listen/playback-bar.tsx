import { useEffect, useRef, useState } from 'react';
import { useMe } from '../../auth/api/auth';
import { smallInputClass, smallSelectClass, toolButtonClass } from '../components/bench-panel';
import { useBench, useBenchLive } from '../session/bench-session';
import { useStore } from '../session/store';
import { useBenchLayout } from '../layout/use-bench-layout';
import { useWorkspaceRuns } from '../workspace/workspace';
import { cautionRead, ListenCaution, rememberCautionRead } from './listen-caution';
import { useListen } from './listen-context';
import { PlaybackOptions } from './playback-options';

type From = { timeS?: number; rpm?: number };

const typing = (t: EventTarget | null) =>
  t instanceof HTMLElement && (t.isContentEditable || t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT');

/**
 * Listening: Play / Pause (space), from the pinned moment, a typed speed or the pointer on the map;
 * the processed sound and the original at the same position (p); the other run of a comparison at the
 * same speed (r); and, below, what is heard and how loud.
 */
export function PlaybackBar() {
  const listen = useListen();
  const status = useStore(listen.status);
  const settings = useStore(listen.settings);
  const live = useBenchLive();
  const pinnedTimeS = useBench((s) => s.pinnedTimeS);
  const runs = useWorkspaceRuns();
  const { data: me } = useMe();
  const userId = me?.id ?? null;
  const [asking, setAsking] = useState<From | null>(null);
  const [rpmText, setRpmText] = useState('');
  const pinUsed = useRef<number | null>(null);
  const [layout, setLayout] = useBenchLayout();

  /** Plays, after the caution the first time this user plays anything. */
  const start = (from: From) => {
    if (!cautionRead(userId)) return setAsking(from);
    void listen.play(from);
  };
  /** Play from the pinned moment when it moved since the last play, else from where the sound stopped. */
  const toggle = (from?: From) => {
    if (listen.playing) return listen.pause();
    if (from) return start(from);
    const heardBaseline = !settings.runId || runs.find((r) => r.id === settings.runId)?.baseline;
    if (pinnedTimeS !== null && pinnedTimeS !== pinUsed.current && heardBaseline) {
      pinUsed.current = pinnedTimeS;
      return start({ timeS: pinnedTimeS });
    }
    start({});
  };
  const latest = useRef({ toggle, listen, live });
  latest.current = { toggle, listen, live };

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey || typing(e.target) || document.querySelector('[role="dialog"]')) return;
      const { toggle: t, listen: l, live: lv } = latest.current;
      if (e.key === ' ') {
        // a focused button takes space itself
        if (e.target instanceof HTMLButtonElement || e.target instanceof HTMLAnchorElement) return;
        e.preventDefault();
        const ptr = lv.pointer.get();
        t(ptr && ptr.from === 'map' && !l.playing ? { timeS: ptr.timeS } : undefined);
      } else if (e.key === 'p') {
        e.preventDefault();
        l.toggleHearing();
      } else if (e.key === 'r') {
        e.preventDefault();
        l.nextRun();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  const processed = settings.processing !== 'off';
  const heardRun = settings.runId ?? runs.find((r) => r.baseline)?.id ?? '';
  return (
    <div role="group" aria-label="Listen" data-testid="playback-bar" className="flex min-w-0 flex-wrap items-center gap-x-2 gap-y-1.5">
      <span className="h-5 w-px bg-ink-800" aria-hidden />
      <button
        type="button"
        className={`${toolButtonClass(status.playing)} w-[4.5rem]`}
        aria-label={status.playing ? 'Pause' : 'Play'}
        title="Play or pause (space; over the map, from the pointer)"
        onClick={() => toggle()}
      >
        <span aria-hidden>{status.playing ? '❚❚' : '▶'}</span> {status.playing ? 'Pause' : 'Play'}
      </button>
      <form
        className="flex items-center gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          const rpm = Number(rpmText);
          if (rpmText.trim() !== '' && rpm > 0) start({ rpm });
        }}
      >
        <input aria-label="Play from rpm" title="Play from the first moment the run reaches this speed" inputMode="decimal" placeholder="from rpm" className={`${smallInputClass()} w-20`} value={rpmText} onChange={(e) => setRpmText(e.target.value)} />
        <button type="submit" className={toolButtonClass()}>
          Go
        </button>
      </form>
      <button
        type="button"
        className={toolButtonClass(settings.hearing === 'processed' && processed)}
        aria-pressed={settings.hearing === 'processed' && processed}
        disabled={!processed}
        title="Switch between the processed sound and the original at the same moment (p)"
        onClick={() => listen.toggleHearing()}
      >
        {settings.hearing === 'processed' && processed ? 'Hearing processed' : 'Hearing original'}
      </button>
      {runs.length > 1 && (
        <select aria-label="Run heard" title="Switch runs at the same speed (r)" className={`${smallSelectClass} max-w-48`} value={heardRun} onChange={(e) => listen.update({ runId: e.target.value })}>
          {runs.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </select>
      )}
      <button
        type="button"
        className={toolButtonClass(layout.listenOptions)}
        aria-expanded={layout.listenOptions}
        aria-controls="listen-options"
        onClick={() => setLayout({ listenOptions: !layout.listenOptions })}
      >
        Listening options
      </button>
      <PlayPosition />
      {layout.listenOptions && (
        <div id="listen-options" className="flex basis-full flex-col gap-1.5 border-t border-ink-800 pt-1.5">
          <PlaybackOptions />
          <p className="text-[11px] text-mist-500">
            Mind the level on headphones: playback starts low and a limiter holds peaks, but the volume is yours to set. Keys: space play or pause, p
            processed or original, r the other run at the same speed.
          </p>
        </div>
      )}
      {status.message && <p className="basis-full text-[11px] text-danger">{status.message}</p>}
      {asking && (
        <ListenCaution
          onCancel={() => setAsking(null)}
          onAccept={() => {
            rememberCautionRead(userId);
            const from = asking;
            setAsking(null);
            void listen.play(from);
          }}
        />
      )}
    </div>
  );
}

/** Where the play head is: time, speed and run (it changes many times a second, so it alone re-renders). */
function PlayPosition() {
  const listen = useListen();
  const head = useStore(listen.playHead);
  const status = useStore(listen.status);
  const heard = status.heard;
  return (
    <p
      className="font-mono text-[11px] text-mist-300"
      data-testid="play-position"
      data-audio-state={status.audio}
      data-playing={status.playing ? 'yes' : 'no'}
      data-time-s={head?.timeS ?? ''}
      data-rpm={head && Number.isFinite(head.rpm) ? head.rpm : ''}
      data-run={head?.runId ?? ''}
      data-hearing={listen.settings.get().hearing}
    >
      {head ? `${head.timeS.toFixed(2)} s` : '—'}
      {head && Number.isFinite(head.rpm) ? ` · ${Math.round(head.rpm)} rpm` : ''}
      {heard ? ` · ${heard.channelName}${heard.lineCount ? `, ${heard.lineCount} guides processed` : ''}` : ''}
    </p>
  );
}
