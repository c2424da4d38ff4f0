import { panScreen, fullView } from '../map/viewport';
import { useBench, useBenchActions, useBenchLive } from '../session/bench-session';
import { ShortcutsDialog, useShortcuts } from './shortcuts';

/** The Bench's keys, and the list of them (?). */
export function BenchKeys() {
  const a = useBenchActions();
  const live = useBenchLive();
  const help = useBench((s) => s.help);
  const swapped = useBench((s) => s.swapped);
  useShortcuts({
    zoom: a.zoom,
    pan: (right, down) => {
      const v = live.viewport.get();
      if (v) a.setView((e) => panScreen(v, e, swapped, right, down));
    },
    reset: () => a.setView(fullView),
    swap: () => a.setSwapped((w) => !w),
    addOrder: () => a.dispatchGuides({ type: 'add-next-order' }),
    addCarrier: a.addDetectedCarrier,
    toggleMark: () => a.setMode((m) => (m === 'mark' ? 'pan' : 'mark')),
    toggleHelp: () => a.setHelp((h) => !h),
    escape: () => {
      a.setHelp(false);
      a.setMode('pan');
    },
    modal: help,
  });
  return help ? <ShortcutsDialog onClose={() => a.setHelp(false)} /> : null;
}
