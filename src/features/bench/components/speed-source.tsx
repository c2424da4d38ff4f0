import { useEffect, useId, useState, type ReactNode } from 'react';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { DEFAULT_PPR, type SpeedSource } from '../../../../workers/io/speed-source';
import type { SpeedState } from '../session/use-speed-curve';
import { smallInputClass, smallSelectClass } from './bench-panel';

export type PoleChoice = { mode: 'inferred' } | { mode: 'typed'; value: number };

export interface InferredPoles {
  value: number | null;
  ambiguous: boolean;
  /** The channel's quantity chose between two answers the sidebands allowed */
  settledByChannel?: boolean;
  pattern: string | null;
  pending: boolean;
}

const parse = (t: string) => (t.trim() === '' ? Number.NaN : Number(t.trim().replace(',', '.')));

/** A number field that keeps what is typed ("0.", "") while handing on the number it means. */
function NumberField({ label, value, onChange, placeholder, width = 'w-20', allowEmpty = false }: { label: string; value: number | null; onChange: (v: number | null) => void; placeholder?: string; width?: string; allowEmpty?: boolean }) {
  const id = useId();
  const [text, setText] = useState(value === null || Number.isNaN(value) ? '' : String(value));
  useEffect(() => {
    setText((t) => {
      const p = parse(t);
      if ((value === null && t.trim() === '') || p === value || (Number.isNaN(p) && value !== null && Number.isNaN(value))) return t;
      return value === null || Number.isNaN(value) ? '' : String(value);
    });
  }, [value]);
  const bad = text.trim() === '' ? !allowEmpty : !Number.isFinite(parse(text));
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-[11px] font-medium text-mist-500">
        {label}
      </label>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        placeholder={placeholder}
        aria-invalid={bad || undefined}
        className={`${smallInputClass(bad)} ${width}`}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          onChange(e.target.value.trim() === '' && allowEmpty ? null : parse(e.target.value));
        }}
      />
    </div>
  );
}

function Field({ label, children }: { label: string; children: (id: string) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-[11px] font-medium text-mist-500">
        {label}
      </label>
      {children(id)}
    </div>
  );
}

const channelName = (c: ChannelSetup) => `${c.index + 1} · ${c.name.trim() || `ch${c.index + 1}`}`;

function ChannelSelect({ label, setup, value, onChange }: { label: string; setup: ChannelSetup[]; value: number; onChange: (channel: number) => void }) {
  return (
    <Field label={label}>
      {(id) => (
        <select id={id} className={`${smallSelectClass} max-w-36`} value={value} onChange={(e) => onChange(Number(e.target.value))}>
          {setup.map((c) => (
            <option key={c.index} value={c.index}>
              {channelName(c)}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** Where the speed comes from, and the pole pairs that turn it into the electrical frequency. */
export function SpeedSourceForm({
  source,
  automatic,
  setup,
  state,
  onChange,
  poles,
  onPoles,
  inferred,
}: {
  source: SpeedSource;
  automatic: boolean;
  setup: ChannelSetup[];
  state: SpeedState;
  onChange: (s: SpeedSource) => void;
  poles: PoleChoice;
  onPoles: (p: PoleChoice) => void;
  inferred: InferredPoles;
}) {
  const first = (q: string) => setup.find((c) => c.quantity === q)?.index ?? setup[0]?.index ?? 0;
  const pick = (kind: SpeedSource['kind']) => {
    if (kind === source.kind) return;
    if (kind === 'none') onChange({ kind: 'none' });
    else if (kind === 'tacho') onChange({ kind: 'tacho', channel: first('tacho'), ppr: DEFAULT_PPR, triggerLevel: null });
    else if (kind === 'channel') onChange({ kind: 'channel', channel: first('speed'), rpmPerUnit: 1 });
    else onChange({ kind: 'ramp', startRpm: 1000, endRpm: 6000 });
  };
  return (
    <div className="flex flex-col gap-2.5" data-testid="speed-source">
      <Field label="Speed from">
        {(id) => (
          <select id={id} className={smallSelectClass} value={source.kind} onChange={(e) => pick(e.target.value as SpeedSource['kind'])}>
            <option value="none">No speed</option>
            <option value="tacho">Tacho pulses</option>
            <option value="channel">Speed channel</option>
            <option value="ramp">Typed ramp</option>
          </select>
        )}
      </Field>
      {source.kind === 'tacho' && (
        <div className="flex flex-wrap items-end gap-2">
          <ChannelSelect label="Tacho channel" setup={setup} value={source.channel} onChange={(channel) => onChange({ ...source, channel })} />
          <NumberField label="Pulses per rev" value={source.ppr} width="w-16" onChange={(v) => onChange({ ...source, ppr: v ?? Number.NaN })} />
          <NumberField
            label="Trigger level"
            value={source.triggerLevel}
            allowEmpty
            placeholder="auto"
            width="w-16"
            onChange={(v) => onChange({ ...source, triggerLevel: v })}
          />
        </div>
      )}
      {source.kind === 'channel' && (
        <div className="flex flex-wrap items-end gap-2">
          <ChannelSelect label="Speed channel" setup={setup} value={source.channel} onChange={(channel) => onChange({ ...source, channel })} />
          <NumberField label="Scale (rpm per unit)" value={source.rpmPerUnit} width="w-20" onChange={(v) => onChange({ ...source, rpmPerUnit: v ?? Number.NaN })} />
        </div>
      )}
      {source.kind === 'ramp' && (
        <div className="flex flex-wrap items-end gap-2">
          <NumberField label="Start (rpm)" value={source.startRpm} onChange={(v) => onChange({ ...source, startRpm: v ?? Number.NaN })} />
          <NumberField label="End (rpm)" value={source.endRpm} onChange={(v) => onChange({ ...source, endRpm: v ?? Number.NaN })} />
        </div>
      )}
      <p className="text-xs text-mist-500" data-testid="speed-summary" role={state.kind === 'error' ? 'alert' : undefined}>
        {state.kind === 'none' && 'No speed: the map runs against time only, and orders have no lines.'}
        {state.kind === 'computing' && (
          <span className="flex items-center gap-2">
            Finding the speed…
            <span role="progressbar" aria-label="Finding the speed" className="inline-block h-1 w-20 overflow-hidden rounded-full bg-ink-700">
              <span className="block h-full w-1/3 animate-[fanlight-slide_1.4s_ease-in-out_infinite] rounded-full bg-accent" />
            </span>
          </span>
        )}
        {state.kind === 'done' && (
          <>
            Speed <span className="font-mono text-mist-100">{Math.round(state.minRpm)}</span>–
            <span className="font-mono text-mist-100">{Math.round(state.maxRpm)}</span> rpm
            {automatic && source.kind === 'tacho' && <> (tacho channel found, {source.ppr} pulses per rev)</>}
          </>
        )}
        {state.kind === 'error' && <span className="text-danger">{state.message}</span>}
      </p>
      <div className="flex flex-wrap items-end gap-2 border-t border-ink-800 pt-2.5">
        <Field label="Pole pairs">
          {(id) => (
            <select
              id={id}
              className={smallSelectClass}
              value={poles.mode}
              onChange={(e) => onPoles(e.target.value === 'typed' ? { mode: 'typed', value: inferred.value ?? 4 } : { mode: 'inferred' })}
            >
              <option value="inferred">Inferred</option>
              <option value="typed">Typed</option>
            </select>
          )}
        </Field>
        {poles.mode === 'typed' && (
          <NumberField label="p" value={poles.value} width="w-14" onChange={(v) => onPoles({ mode: 'typed', value: v ?? Number.NaN })} />
        )}
      </div>
      <p className="text-xs text-mist-500" data-testid="pole-pairs-note">
        {poles.mode === 'typed'
          ? Number.isInteger(poles.value) && poles.value >= 1
            ? `fe = ${poles.value} × fr, as typed.`
            : 'Type a whole number of pole pairs.'
          : inferred.pending
            ? 'Inferred from the sideband spacing once the findings are in.'
            : inferred.value
              ? `Inferred from the sideband spacing: ${inferred.value}${inferred.ambiguous ? ' (ambiguous: check it)' : inferred.settledByChannel ? ' (with the channel’s quantity choosing between two fits: check it)' : ''}.`
              : 'Not inferred: no sideband families were found. Type it to draw the families.'}
      </p>
    </div>
  );
}
