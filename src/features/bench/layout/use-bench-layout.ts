import { createContext, useCallback, useContext, useEffect, useState } from 'react';
import { useMe } from '../../auth/api/auth';

/** How the engineer arranged the Bench: the open side section, the right column's width, what is folded. */
export interface BenchLayoutPrefs {
  /** The left sections shown beside the rail, in the rail's order (none: only the rail) */
  left: string[];
  /** The right column: open at this width (px), or folded to its rail */
  rightOpen: boolean;
  rightWidthPx: number;
  /** The map's settings row shown above the map */
  mapSettings: boolean;
  /** The listening options shown under the recording bar */
  listenOptions: boolean;
}

export const RIGHT_MIN_PX = 260;
export const RIGHT_MAX_PX = 720;

const defaults: BenchLayoutPrefs = { left: [], rightOpen: true, rightWidthPx: 280, mapSettings: false, listenOptions: false };

const keyOf = (userId: number | null) => `fanlight.bench-layout.v1.${userId ?? 'anonymous'}`;

function read(userId: number | null): BenchLayoutPrefs {
  try {
    const raw = localStorage.getItem(keyOf(userId));
    const parsed = raw ? (JSON.parse(raw) as Partial<BenchLayoutPrefs>) : {};
    const width = Number(parsed.rightWidthPx);
    return {
      left: Array.isArray(parsed.left) ? parsed.left.filter((v): v is string => typeof v === 'string') : [],
      rightOpen: parsed.rightOpen !== false,
      rightWidthPx: Number.isFinite(width) ? Math.min(RIGHT_MAX_PX, Math.max(RIGHT_MIN_PX, width)) : defaults.rightWidthPx,
      mapSettings: parsed.mapSettings === true,
      listenOptions: parsed.listenOptions === true,
    };
  } catch {
    return defaults;
  }
}

/** The layout, remembered per user in this browser (a storage that fails keeps it for the session only). */
export function useBenchLayoutState(): [BenchLayoutPrefs, (patch: Partial<BenchLayoutPrefs>) => void] {
  const { data: me } = useMe();
  const userId = me?.id ?? null;
  const [prefs, setPrefs] = useState(() => read(userId));
  useEffect(() => setPrefs(read(userId)), [userId]);
  const update = useCallback(
    (patch: Partial<BenchLayoutPrefs>) =>
      setPrefs((prev) => {
        const next = { ...prev, ...patch };
        try {
          localStorage.setItem(keyOf(userId), JSON.stringify(next));
        } catch {
          // private mode: kept for this visit
        }
        return next;
      }),
    [userId],
  );
  return [prefs, update];
}

export const BenchLayoutContext = createContext<[BenchLayoutPrefs, (patch: Partial<BenchLayoutPrefs>) => void] | null>(null);

/** The Bench's layout where a panel needs it (outside the Bench: the defaults, unchangeable). */
export function useBenchLayout(): [BenchLayoutPrefs, (patch: Partial<BenchLayoutPrefs>) => void] {
  return useContext(BenchLayoutContext) ?? [defaults, () => undefined];
}
