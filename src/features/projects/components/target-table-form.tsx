import { useState, type FormEvent } from 'react';
import { TargetWeightingField } from './target-weighting';
import { targetTrack } from '../../../../server/schemas/targets';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-message';
import { useCreateTarget } from '../api/targets';

const cell = 'w-24 rounded border border-ink-700 bg-ink-950 px-1.5 py-0.5 font-mono text-xs';

/** A target typed in a small table: its track, its weighting, and its points (rpm, dB). */
export function TargetTableForm({ projectId, onDone }: { projectId: number; onDone: () => void }) {
  const create = useCreateTarget(projectId);
  const [track, setTrack] = useState('');
  const [weighting, setWeighting] = useState<'A' | 'Z'>('Z');
  const [rows, setRows] = useState<[string, string][]>([
    ['', ''],
    ['', ''],
  ]);
  const [problems, setProblems] = useState<string[]>([]);

  const setCell = (i: number, j: 0 | 1, v: string) => setRows((rs) => rs.map((r, k) => (k === i ? ((j === 0 ? [v, r[1]] : [r[0], v]) as [string, string]) : r)));

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const bad: string[] = [];
    if (!targetTrack.safeParse(track).success) bad.push('Track: write order:K, family:M:N or overall.');
    const points = rows
      .filter(([r, d]) => r.trim() !== '' || d.trim() !== '')
      .map(([r, d], i) => {
        const rpm = Number(r.replace(',', '.'));
        const db = Number(d.replace(',', '.'));
        if (!Number.isFinite(rpm) || rpm < 0) bad.push(`Point ${i + 1}: "${r}" is not a speed in rpm.`);
        if (!Number.isFinite(db)) bad.push(`Point ${i + 1}: "${d}" is not a level in dB.`);
        return [rpm, db] as [number, number];
      });
    if (points.length < 2) bad.push('A target needs at least two points.');
    setProblems(bad);
    if (bad.length) return;
    try {
      await create.mutateAsync({ track, weighting, points: [...points].sort((a, b) => a[0] - b[0]) });
      onDone();
    } catch (err) {
      const fields = err instanceof ApiError ? Object.entries(err.fields).map(([where, what]) => `${where}: ${what}`) : [];
      setProblems([errorMessage(err), ...fields]);
    }
  };

  return (
    <form className="flex flex-col gap-2 text-xs" onSubmit={submit} aria-label="Type a target">
      <div className="flex flex-wrap items-center gap-3">
        <label className="flex items-center gap-1.5">
          Track
          <input className={`${cell} w-32`} value={track} onChange={(e) => setTrack(e.target.value)} placeholder="family:1:2" aria-label="Target track" />
        </label>
        <TargetWeightingField value={weighting} onChange={setWeighting} />
      </div>
      <table className="w-fit" aria-label="Target points">
        <thead>
          <tr className="text-mist-500">
            <th className="pr-2 text-left font-medium">rpm</th>
            <th className="text-left font-medium">dB</th>
          </tr>
        </thead>
        <tbody>
          {rows.map(([r, d], i) => (
            <tr key={i}>
              <td className="pr-2 pb-1">
                <input className={cell} value={r} inputMode="decimal" aria-label={`Speed of point ${i + 1}`} onChange={(e) => setCell(i, 0, e.target.value)} />
              </td>
              <td className="pb-1">
                <input className={cell} value={d} inputMode="decimal" aria-label={`Level of point ${i + 1}`} onChange={(e) => setCell(i, 1, e.target.value)} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex gap-2">
        <button type="button" className="rounded px-2 py-1 text-mist-300 ring-1 ring-ink-700 hover:text-mist-100" onClick={() => setRows((rs) => [...rs, ['', '']])}>
          Add a point
        </button>
        <Button type="submit" disabled={create.isPending}>
          {create.isPending ? 'Saving…' : 'Save target'}
        </Button>
      </div>
      {problems.length > 0 && (
        <Notice tone="error">
          <ul className="flex flex-col gap-0.5">
            {problems.map((p, i) => (
              <li key={i}>{p}</li>
            ))}
          </ul>
        </Notice>
      )}
    </form>
  );
}
