import { useState, type FormEvent } from 'react';
import { TargetWeightingField } from './target-weighting';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-message';
import { useImportTargets } from '../api/targets';

/** Targets from a CSV file (`track,rpm,db`), at one weighting; with "replace", the weighting's targets become the file's. */
export function TargetImportForm({ projectId, onDone }: { projectId: number; onDone: () => void }) {
  const importTargets = useImportTargets(projectId);
  const [file, setFile] = useState<File | null>(null);
  const [weighting, setWeighting] = useState<'A' | 'Z'>('Z');
  const [replace, setReplace] = useState(false);
  const [problems, setProblems] = useState<string[]>([]);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setProblems([]);
    if (!file) return setProblems(['Choose a CSV file.']);
    try {
      await importTargets.mutateAsync({ csv: await file.text(), weighting, replace });
      onDone();
    } catch (err) {
      // the server names each bad line and field ("line 4: rpm")
      const fields = err instanceof ApiError ? Object.entries(err.fields).map(([where, what]) => `${where}: ${what}`) : [];
      setProblems([`${file.name}: ${errorMessage(err)}`, ...fields]);
    }
  };

  return (
    <form className="flex flex-col gap-2" onSubmit={submit} aria-label="Import targets">
      <p className="text-xs text-mist-500">
        One point per row under the header <span className="font-mono">track,rpm,db</span>, e.g. <span className="font-mono">family:1:2,3000,-20</span>,{' '}
        <span className="font-mono">order:48,3000,-35</span> or <span className="font-mono">overall,3000,-10</span>.
      </p>
      <div className="flex flex-wrap items-center gap-3 text-xs">
        <input type="file" accept=".csv,text/csv" aria-label="Targets CSV file" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
        <TargetWeightingField value={weighting} onChange={setWeighting} />
        <label className="flex items-center gap-1.5">
          <input type="checkbox" checked={replace} onChange={(e) => setReplace(e.target.checked)} />
          replace this weighting’s targets
        </label>
        <Button type="submit" disabled={importTargets.isPending}>
          {importTargets.isPending ? 'Importing…' : 'Import'}
        </Button>
      </div>
      {problems.length > 0 && (
        <Notice tone="error">
          <ul className="flex flex-col gap-0.5" data-testid="target-import-problems">
            {problems.map((p, i) => (
              <li key={i}>{p}</li>
            ))}
          </ul>
        </Notice>
      )}
    </form>
  );
}
