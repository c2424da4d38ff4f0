import type { TargetWeighting } from '../../../../server/schemas/targets';

/** The weighting a target's levels are in: A, or none (Z). */
export function TargetWeightingField({ value, onChange }: { value: TargetWeighting; onChange: (w: TargetWeighting) => void }) {
  return (
    <label className="flex items-center gap-1.5">
      Weighting
      <select className="rounded border border-ink-700 bg-ink-950 px-1.5 py-0.5" value={value} onChange={(e) => onChange(e.target.value as TargetWeighting)}>
        <option value="Z">Z (none)</option>
        <option value="A">A</option>
      </select>
    </label>
  );
}
