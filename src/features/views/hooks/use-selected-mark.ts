import { useSearchParams } from 'react-router-dom';

/** The mark chosen in the address (`?mark=`), and how to choose one without a new history entry. */
export function useSelectedMark() {
  const [params, setParams] = useSearchParams();
  const selectedMarkId = Number(params.get('mark')) || null;
  const selectMark = (markId: number) =>
    setParams(
      (p) => {
        p.set('mark', String(markId));
        return p;
      },
      { replace: true, preventScrollReset: true },
    );
  return { selectedMarkId, selectMark };
}
