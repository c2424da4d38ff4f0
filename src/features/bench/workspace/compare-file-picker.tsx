import { useRef } from 'react';

/** With a recording open: a file of the engineer's put beside it for comparison (a drop above opens one instead). */
export function CompareFilePicker({ busy, onFile }: { busy: boolean; onFile: (file: File) => void }) {
  const input = useRef<HTMLInputElement>(null);
  return (
    <div className="flex items-center gap-2 text-xs text-mist-500">
      <input
        ref={input}
        type="file"
        className="sr-only"
        accept=".wav,.csv,.tsv,.txt"
        aria-label="A recording to compare with the open one"
        onChange={(e) => {
          const f = e.target.files?.[0];
          if (f) onFile(f);
          e.target.value = '';
        }}
      />
      <button type="button" className="rounded px-2 py-1 text-accent hover:bg-ink-800 disabled:opacity-50" disabled={busy} onClick={() => input.current?.click()}>
        {busy ? 'Reading…' : 'Add a file to compare…'}
      </button>
    </div>
  );
}
