import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { linkClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';

export type Outcome = { tone: 'ok'; viewId: number; title: string } | { tone: 'error'; message: string };

/** How the last save went: a link to the saved view, or why it was not saved. */
export function SaveOutcome({ outcome }: { outcome: Outcome | null }) {
  if (!outcome) return null;
  if (outcome.tone === 'error') return <Notice tone="error">{outcome.message}</Notice>;
  return (
    <Notice tone="ok">
      Saved as{' '}
      <Link to={paths.view(outcome.viewId)} className={linkClass} data-testid="saved-view-link">
        {outcome.title}
      </Link>
    </Notice>
  );
}
