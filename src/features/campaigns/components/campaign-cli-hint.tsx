import { Link } from 'react-router-dom';
import { linkClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';

/** How results reach a campaign: the batch command with a personal token, as the README's "Batch mode" gives it. */
export function CampaignCliHint({ projectId }: { projectId: number }) {
  const server = typeof window === 'undefined' ? 'http://localhost:5173' : window.location.origin;
  const command = `npm run -s analyze -- campaign DIR --preset PRESET.json --name "NAME" --project ${projectId} --server ${server} --token flt_…`;
  return (
    <div className="flex flex-col gap-2 text-sm text-mist-300" data-testid="campaign-cli-hint">
      <p>
        A campaign runs one analysis preset over a folder of recordings from the command line, and registers each file’s result here as it finishes. Make a token for this project in{' '}
        <Link to={paths.settings} className={linkClass}>
          Settings → API tokens
        </Link>{' '}
        (engineer or lead), then run:
      </p>
      <pre className="overflow-x-auto rounded-md bg-ink-950 px-3 py-2 font-mono text-xs text-mist-100">{command}</pre>
      <p className="text-xs text-mist-500">
        PRESET.json holds the <code className="font-mono">inverter</code> command’s options, such as <code className="font-mono">{'{"channel":0,"tacho":1,"ppr":60,"polePairs":4}'}</code>. Tags per
        file (build, firmware, temperature…) come from <code className="font-mono">--tags TAGS.csv</code> or a <code className="font-mono">tags.csv</code> in the folder, with the header{' '}
        <code className="font-mono">file,&lt;tag&gt;,…</code>. Add <code className="font-mono">--workers N</code> for more threads, or <code className="font-mono">--queue redis://HOST:PORT</code> and{' '}
        <code className="font-mono">npm run -s analyze-worker -- --queue redis://HOST:PORT</code> on other machines.
      </p>
    </div>
  );
}
