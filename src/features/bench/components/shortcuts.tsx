import { useEffect, useRef } from 'react';
import { ModalDialog } from '../../../components/ui/modal-dialog';

export const SHORTCUTS: [string, string][] = [
  ['+  /  −', 'Zoom in / out'],
  ['← → ↑ ↓', 'Pan'],
  ['0', 'The whole map'],
  ['s', 'Swap axes (frequency across or up)'],
  ['g', 'Add the next whole order guide'],
  ['c', 'Add a carrier guide that follows the detected carrier'],
  ['m', 'Add marks: click for a point, Shift-drag for a box'],
  ['Shift + drag', 'Zoom into a box'],
  ['Space', 'Play or pause (over the map: from the pointer)'],
  ['p', 'Hear the processed sound or the original'],
  ['r', 'Hear the other run at the same speed'],
  ['?', 'Show or hide this list'],
  ['Esc', 'Close this list, leave a pick mode'],
];

export interface ShortcutActions {
  zoom(factor: number): void;
  pan(right: number, down: number): void;
  reset(): void;
  swap(): void;
  addOrder(): void;
  addCarrier(): void;
  toggleMark(): void;
  toggleHelp(): void;
  escape(): void;
  /** The list is open: only ? and Esc act */
  modal: boolean;
}

const typing = (t: EventTarget | null) =>
  t instanceof HTMLElement && (t.isContentEditable || t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT');

/** The Bench's keys, on the whole page; ignored while typing in a field. */
export function useShortcuts(actions: ShortcutActions) {
  const ref = useRef(actions);
  ref.current = actions;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey || typing(e.target)) return;
      const a = ref.current;
      const handled: Record<string, () => void> = {
        '+': () => a.zoom(1 / 1.5),
        '=': () => a.zoom(1 / 1.5),
        '-': () => a.zoom(1.5),
        '_': () => a.zoom(1.5),
        ArrowLeft: () => a.pan(-0.1, 0),
        ArrowRight: () => a.pan(0.1, 0),
        ArrowUp: () => a.pan(0, -0.1),
        ArrowDown: () => a.pan(0, 0.1),
        '0': () => a.reset(),
        s: () => a.swap(),
        S: () => a.swap(),
        g: () => a.addOrder(),
        c: () => a.addCarrier(),
        m: () => a.toggleMark(),
        '?': () => a.toggleHelp(),
        Escape: () => a.escape(),
      };
      const run = handled[e.key];
      if (!run || (a.modal && e.key !== '?' && e.key !== 'Escape')) return;
      e.preventDefault();
      run();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}

export function ShortcutsDialog({ onClose }: { onClose: () => void }) {
  const closeRef = useRef<HTMLButtonElement>(null);
  return (
    <ModalDialog
      title="Keyboard shortcuts"
      onClose={onClose}
      initialFocus={closeRef}
      heading={
        <button ref={closeRef} type="button" className="ml-auto rounded-md px-2 py-1 text-sm text-mist-300 hover:bg-ink-800" onClick={onClose}>
          Close
        </button>
      }
    >
      <dl className="grid grid-cols-[8rem_1fr] gap-x-4 gap-y-2 text-sm">
        {SHORTCUTS.map(([k, what]) => (
          <div key={k} className="contents">
            <dt>
              <kbd className="rounded border border-ink-600 bg-ink-850 px-1.5 py-0.5 font-mono text-xs text-mist-100">{k}</kbd>
            </dt>
            <dd className="text-mist-300">{what}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-4 text-xs text-mist-500">Keys do nothing while you type in a field.</p>
    </ModalDialog>
  );
}
