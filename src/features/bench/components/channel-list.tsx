import { useEffect, useState } from 'react';
import {
  calibrationProblem,
  defaultUnit,
  quantities,
  type Calibration,
  type ChannelSetup,
  type Quantity,
} from '../../../../workers/io/channel-setup';
import { compactSelectClass } from '../../../components/ui/styles';

const compactInputClass =
  'rounded-md border bg-ink-950 px-2 py-1 text-sm text-mist-100 placeholder:text-mist-500 focus:border-accent';

const quantityLabel: Record<Quantity, string> = {
  acceleration: 'Acceleration',
  velocity: 'Velocity',
  'sound-pressure': 'Sound pressure',
  voltage: 'Voltage',
  speed: 'Speed',
  tacho: 'Tacho',
  other: 'Other',
};

// A starting point when one switches to a sensitivity; the engineer types the transducer's own.
const firstSensitivity: Calibration = { kind: 'sensitivity', sensitivityMvPerUnit: 100, inputRangeV: 10 };

interface ChannelListProps {
  setup: ChannelSetup[];
  /** `now`: save at once (selects), else after a pause in typing. */
  onChange: (setup: ChannelSetup[], now?: boolean) => void;
  onBlur: () => void;
}

export function ChannelList({ setup, onChange, onBlur }: ChannelListProps) {
  const edit = (i: number, patch: Partial<ChannelSetup>, now = false) =>
    onChange(setup.map((c, j) => (j === i ? { ...c, ...patch } : c)), now);

  return (
    <table className="w-full border-collapse text-sm" data-testid="channel-list">
      <thead className="sr-only">
        <tr>
          <th>#</th>
          <th>Name, quantity, unit and calibration</th>
        </tr>
      </thead>
      <tbody>
        {setup.map((c, i) => {
          const n = c.index + 1;
          const nameMissing = c.name.trim() === '';
          const problem = calibrationProblem(c.calibration);
          return (
            <tr key={c.index} className="border-b border-ink-800 align-top last:border-b-0" data-channel-index={c.index}>
              <td className="w-6 py-2 pr-2 pt-3 font-mono text-xs text-mist-500">{n}</td>
              <td className="py-2">
                <div className="flex flex-col gap-1.5">
                  <input
                    aria-label={`Name of channel ${n}`}
                    aria-invalid={nameMissing || undefined}
                    className={`${compactInputClass} w-full ${nameMissing ? 'border-danger' : 'border-ink-700'}`}
                    value={c.name}
                    maxLength={120}
                    onChange={(e) => edit(i, { name: e.target.value })}
                    onBlur={onBlur}
                  />
                  {nameMissing && <p className="text-xs text-danger">Name the channel.</p>}
                  <div className="flex gap-1.5">
                    <select
                      aria-label={`Quantity of channel ${n}`}
                      className={`${compactSelectClass} min-w-0 flex-1`}
                      value={c.quantity}
                      onChange={(e) => {
                        const quantity = e.target.value as Quantity;
                        // Follow the quantity's usual unit unless the engineer typed one of their own.
                        const keepUnit = c.unit !== '' && c.unit !== defaultUnit[c.quantity];
                        edit(i, { quantity, unit: keepUnit ? c.unit : defaultUnit[quantity] }, true);
                      }}
                    >
                      {quantities.map((q) => (
                        <option key={q} value={q}>
                          {quantityLabel[q]}
                        </option>
                      ))}
                    </select>
                    <input
                      aria-label={`Unit of channel ${n}`}
                      className={`${compactInputClass} w-20 border-ink-700 font-mono`}
                      value={c.unit}
                      maxLength={40}
                      onChange={(e) => edit(i, { unit: e.target.value })}
                      onBlur={onBlur}
                    />
                  </div>
                  <div className="flex flex-wrap items-center gap-1.5">
                    <select
                      aria-label={`Calibration of channel ${n}`}
                      className={compactSelectClass}
                      value={c.calibration.kind}
                      onChange={(e) =>
                        edit(
                          i,
                          { calibration: e.target.value === 'sensitivity' ? firstSensitivity : { kind: 'scale', factor: 1 } },
                          true,
                        )
                      }
                    >
                      <option value="scale">Scale factor</option>
                      <option value="sensitivity">Sensitivity</option>
                    </select>
                    {c.calibration.kind === 'scale' ? (
                      <NumberInput
                        label={`Factor of channel ${n}`}
                        value={c.calibration.factor}
                        invalid={problem !== null}
                        onChange={(factor) => edit(i, { calibration: { kind: 'scale', factor } })}
                        onBlur={onBlur}
                      />
                    ) : (
                      <SensitivityInputs
                        n={n}
                        calibration={c.calibration}
                        invalid={problem !== null}
                        onChange={(calibration) => edit(i, { calibration })}
                        onBlur={onBlur}
                      />
                    )}
                  </div>
                  {problem && (
                    <p className="text-xs text-danger" data-testid="calibration-problem">
                      {problem}
                    </p>
                  )}
                </div>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function SensitivityInputs({
  n,
  calibration,
  invalid,
  onChange,
  onBlur,
}: {
  n: number;
  calibration: Extract<Calibration, { kind: 'sensitivity' }>;
  invalid: boolean;
  onChange: (c: Calibration) => void;
  onBlur: () => void;
}) {
  return (
    <>
      <span className="inline-flex items-center gap-1">
        <NumberInput
          label={`Sensitivity of channel ${n} (mV per unit)`}
          value={calibration.sensitivityMvPerUnit}
          invalid={invalid && !(calibration.sensitivityMvPerUnit > 0)}
          onChange={(sensitivityMvPerUnit) => onChange({ ...calibration, sensitivityMvPerUnit })}
          onBlur={onBlur}
        />
        <span className="text-xs text-mist-500">mV/unit</span>
      </span>
      <span className="inline-flex items-center gap-1">
        <NumberInput
          label={`Input range of channel ${n} (V)`}
          value={calibration.inputRangeV}
          invalid={invalid && !(calibration.inputRangeV > 0)}
          onChange={(inputRangeV) => onChange({ ...calibration, inputRangeV })}
          onBlur={onBlur}
        />
        <span className="text-xs text-mist-500">V</span>
      </span>
    </>
  );
}

/** Keeps what is typed ("0.", "1e") while the setup holds the number it means (NaN when it means none). */
function NumberInput({
  label,
  value,
  invalid,
  onChange,
  onBlur,
}: {
  label: string;
  value: number;
  invalid: boolean;
  onChange: (value: number) => void;
  onBlur: () => void;
}) {
  const [text, setText] = useState(() => (Number.isFinite(value) ? String(value) : ''));
  useEffect(() => {
    setText((t) => (parse(t) === value || (Number.isNaN(value) && Number.isNaN(parse(t))) ? t : String(value)));
  }, [value]);
  return (
    <input
      type="text"
      inputMode="decimal"
      aria-label={label}
      aria-invalid={invalid || undefined}
      className={`${compactInputClass} w-20 font-mono ${invalid ? 'border-danger' : 'border-ink-700'}`}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        onChange(parse(e.target.value));
      }}
      onBlur={onBlur}
    />
  );
}

const parse = (text: string) => (text.trim() === '' ? Number.NaN : Number(text.trim().replace(',', '.')));
