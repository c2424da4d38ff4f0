import { useState } from 'react';
import { Button } from '../../../components/ui/button';

/** A new token's secret, shown this once: the server keeps only its hash. */
export function TokenSecret({ name, secret, onClose }: { name: string; secret: string; onClose: () => void }) {
  const [copied, setCopied] = useState<'no' | 'yes' | 'failed'>('no');
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied('yes');
    } catch {
      // the clipboard needs a secure context and a permission; the secret stays selectable by hand
      setCopied('failed');
    }
  };
  return (
    <div role="status" className="flex flex-col gap-2 rounded-md border border-ok/60 p-3 text-sm" data-testid="token-secret">
      <p className="text-mist-100">
        The token “{name}” is made. Copy its secret now: <strong>it will not be shown again</strong>, and Fanlight keeps only a hash of it.
      </p>
      <div className="flex flex-wrap items-center gap-2">
        <code className="select-all break-all rounded bg-ink-950 px-2 py-1 font-mono text-xs text-mist-100" data-testid="token-secret-value">
          {secret}
        </code>
        <Button type="button" variant="quiet" className="px-2.5 py-1 text-xs" onClick={copy}>
          {copied === 'yes' ? 'Copied' : 'Copy'}
        </Button>
        <Button type="button" variant="quiet" className="px-2.5 py-1 text-xs" onClick={onClose}>
          I have copied it
        </Button>
      </div>
      {copied === 'failed' && <p className="text-xs text-danger">The browser refused the clipboard; select the secret and copy it by hand.</p>}
      <p className="text-xs text-mist-500">
        Use it as <code className="font-mono">--token</code> of <code className="font-mono">npm run -s analyze -- campaign</code>, or send it as{' '}
        <code className="font-mono">Authorization: Bearer …</code>.
      </p>
    </div>
  );
}
