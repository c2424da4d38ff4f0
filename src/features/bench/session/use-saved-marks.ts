import { useMemo } from 'react';
import type { Mark } from '../../../../server/schemas/views';
import { useMarks } from '../../views/api/marks';
import { markOnMap, type ViewOnBench } from '../view-state/view-restore';
import type { BenchMark } from '../view-state/view-snapshot';

export interface SavedMarksOnMap {
  /** The view's marks in the server's order, numbered as on the view page */
  marks: Mark[];
  /** Those the map can draw now: point and box marks, while the map is against the axis they were placed on */
  onMap: BenchMark[];
  isPending: boolean;
  error: Error | null;
}

/** The marks of the view the Bench was opened from, and where they sit on the map. */
export function useSavedMarksOnMap(fromView: ViewOnBench | undefined, against: 'time' | 'speed'): SavedMarksOnMap {
  const query = useMarks(fromView?.view.id ?? 0, fromView !== undefined);
  const marks = fromView ? query.data : undefined;
  const savedAgainst = fromView?.restore.against;
  const savedSwapped = fromView?.restore.swapped ?? false;
  const onMap = useMemo(() => {
    if (!marks || against !== savedAgainst) return [];
    const out: BenchMark[] = [];
    marks.forEach((m, i) => {
      const placed = markOnMap(m, savedSwapped);
      if (placed) out.push({ ...placed, number: i + 1 });
    });
    return out;
  }, [marks, against, savedAgainst, savedSwapped]);
  const isPending = fromView !== undefined && query.isPending;
  return useMemo(() => ({ marks: marks ?? [], onMap, isPending, error: query.error }), [marks, onMap, isPending, query.error]);
}

