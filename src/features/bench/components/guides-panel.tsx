import { useId, useState, type Dispatch, type FormEvent } from 'react';
import { carrierSummary } from '../analysis/findings-text';
import { useBench, useBenchActions } from '../session/bench-session';
import { familyDetail, familyLabel, orderLabel } from '../../../../workers/dsp/guide-formula';
import {
  familyLineId,
  orderLineId,
  type CarrierGuideSpec,
  type Family,
  type GuidesAction,
} from '../map/guides';
import { BenchPanel, smallInputClass, smallSelectClass, toolButtonClass } from './bench-panel';
import { guideColour } from '../../../lib/plot/overlay';

const parse = (t: string) => (t.trim() === '' ? Number.NaN : Number(t.trim().replace(',', '.').replace('\u2212', '-')));

function Swatch({ selected, kind }: { selected: boolean; kind: 'order' | 'family' }) {
  const colour = guideColour(kind, selected);
  return (
    <span
      aria-hidden
      className="inline-block h-0 w-4 shrink-0 border-t-2"
      style={{ borderColor: colour, borderTopStyle: kind === 'family' ? 'dashed' : 'solid' }}
    />
  );
}

function LineRow({
  label,
  detail,
  selected,
  kind,
  onToggle,
  onRemove,
  hidden,
  onHide,
}: {
  label: string;
  detail: string;
  selected: boolean;
  kind: 'order' | 'family';
  onToggle: () => void;
  onRemove: () => void;
  hidden?: boolean;
  onHide?: () => void;
}) {
  return (
    <li className={`group flex items-center gap-2 py-0.5 text-xs ${hidden ? 'opacity-50' : ''}`} data-testid={kind === 'order' ? 'guide-order' : 'guide-family'}>
      <input type="checkbox" className="accent-accent" checked={selected} onChange={onToggle} aria-label={`Track ${label}`} title="Track it in the dock; tracked lines are drawn in the accent colour" />
      <Swatch selected={selected} kind={kind} />
      <span className={`font-mono ${selected ? 'text-accent-strong' : 'text-mist-100'}`}>{label}</span>
      <span className="font-mono text-[11px] text-mist-500">{detail}</span>
      {onHide && (
        <button type="button" className="ml-auto rounded px-1.5 text-[11px] text-mist-500 hover:bg-ink-800 hover:text-mist-100" aria-label={`${hidden ? 'Show' : 'Hide'} ${label}`} onClick={onHide}>
          {hidden ? 'show' : 'hide'}
        </button>
      )}
      <button
        type="button"
        className={`${onHide ? '' : 'ml-auto '}rounded px-1.5 text-mist-500 opacity-60 hover:bg-ink-800 hover:text-danger group-hover:opacity-100`}
        aria-label={`Remove ${label}`}
        onClick={onRemove}
      >
        ×
      </button>
    </li>
  );
}

/** n typed as 1, -1, +1 or ±1 (the last adds both signs). */
function parseFamilies(mText: string, nText: string): Family[] | null {
  const m = parse(mText);
  const t = nText.trim();
  const both = /^(±|\+-|\+\/-)/.test(t);
  const n = parse(both ? t.replace(/^(±|\+-|\+\/-)/, '') : t);
  if (!(Number.isInteger(m) && m >= 1 && m <= 8 && Number.isInteger(n) && Math.abs(n) <= 40)) return null;
  return both && n !== 0 ? [{ m, n: -Math.abs(n) }, { m, n: Math.abs(n) }] : [{ m, n }];
}

/** The order and carrier guides: add, tick (tracked), hide, remove; carriers typed, picked or detected. */
export function GuidesPanel() {
  const a = useBenchActions();
  const report = useBench((s) => s.report);
  const detectedHz = useBench((s) => s.detectedHz);
  const mode = useBench((s) => s.mode);
  const p = {
    guides: useBench((s) => s.guides),
    dispatch: a.dispatchGuides,
    detectedSummary: report && detectedHz ? carrierSummary(report) : null,
    canDetect: detectedHz !== null,
    onAddDetected: a.addDetectedCarrier,
    onAddTyped: (hz: number) => a.addCarrierAt(hz, 'typed'),
    picking: mode === 'pick',
    onPick: (on: boolean) => a.setMode(on ? 'pick' : 'pan'),
    speedAvailable: useBench((s) => s.frameRpm !== null),
    polePairs: useBench((s) => s.polePairs),
  };
  const { guides, dispatch } = p;
  const [orderText, setOrderText] = useState('');
  const [centreText, setCentreText] = useState('');
  const orderId = useId();
  const centreId = useId();
  const orderValue = parse(orderText);
  const orderOk = orderValue > 0 && orderValue <= 1000;
  const centre = parse(centreText);
  const centreOk = centre > 0 && centre < 1e6;

  const addOrder = (e: FormEvent) => {
    e.preventDefault();
    if (!orderOk) return;
    dispatch({ type: 'add-order', order: orderValue });
    setOrderText('');
  };
  const addCarrier = (e: FormEvent) => {
    e.preventDefault();
    if (!centreOk) return;
    p.onAddTyped(centre);
    setCentreText('');
  };

  return (
    <BenchPanel title="Guides" testId="guides-panel">
      <div className="flex flex-col gap-4 text-sm">
        <div className="flex flex-col gap-2">
          <h3 className="text-[11px] font-medium uppercase tracking-wider text-mist-500">Orders · f = k·fr</h3>
          <form className="flex items-end gap-1.5" onSubmit={addOrder}>
            <div className="flex flex-col gap-1">
              <label htmlFor={orderId} className="text-[11px] text-mist-500">
                Order k
              </label>
              <input id={orderId} className={`${smallInputClass(orderText !== '' && !orderOk)} w-20`} inputMode="decimal" value={orderText} onChange={(e) => setOrderText(e.target.value)} placeholder="8" />
            </div>
            <button type="submit" className={toolButtonClass()} disabled={!orderOk}>
              Add order
            </button>
            <button type="button" className={toolButtonClass()} title="Add the next whole order (g)" onClick={() => dispatch({ type: 'add-next-order' })}>
              Next
            </button>
          </form>
          {!p.speedAvailable && guides.orders.length > 0 && <p className="text-xs text-mist-500">Orders need a speed: set a speed source to draw them.</p>}
          {guides.orders.length > 0 && (
            <ul className="flex flex-col" aria-label="Order guides">
              {guides.orders.map((o) => {
                const label = orderLabel(o.order);
                return (
                  <LineRow
                    key={o.id}
                    label={label}
                    detail={`k ${o.order}`}
                    kind="order"
                    selected={guides.selected.includes(orderLineId(o))}
                    onToggle={() => dispatch({ type: 'toggle-selected', lineId: orderLineId(o) })}
                    onRemove={() => dispatch({ type: 'remove-order', id: o.id })}
                    hidden={o.hidden}
                    onHide={() => dispatch({ type: 'toggle-order', id: o.id })}
                  />
                );
              })}
            </ul>
          )}
        </div>

        <div className="flex flex-col gap-2 border-t border-ink-800 pt-3">
          <h3 className="text-[11px] font-medium uppercase tracking-wider text-mist-500">Carrier · f = m·fc + n·fe</h3>
          <form className="flex flex-wrap items-end gap-1.5" onSubmit={addCarrier}>
            <div className="flex flex-col gap-1">
              <label htmlFor={centreId} className="text-[11px] text-mist-500">
                Carrier centre (Hz)
              </label>
              <input id={centreId} className={`${smallInputClass(centreText !== '' && !centreOk)} w-24`} inputMode="decimal" value={centreText} onChange={(e) => setCentreText(e.target.value)} placeholder="8000" />
            </div>
            <button type="submit" className={toolButtonClass()} disabled={!centreOk}>
              Add carrier guide
            </button>
          </form>
          <div className="flex flex-wrap gap-1.5">
            <button type="button" className={toolButtonClass(p.picking)} aria-pressed={p.picking} onClick={() => p.onPick(!p.picking)} title="Click the carrier on the map to centre a guide there">
              Pick on map
            </button>
            <button type="button" className={toolButtonClass()} disabled={!p.canDetect} onClick={p.onAddDetected} title="A guide that follows the detected carrier and its shifts (c)">
              Follow detected
            </button>
          </div>
          {p.detectedSummary && <p className="text-xs text-mist-500">Detected: {p.detectedSummary}</p>}
          {guides.carriers.map((c) => (
            <CarrierCard key={c.id} c={c} selected={guides.selected} dispatch={dispatch} canDetect={p.canDetect} polePairs={p.polePairs} speedAvailable={p.speedAvailable} />
          ))}
        </div>
      </div>
    </BenchPanel>
  );
}

function CarrierCard({
  c,
  selected,
  dispatch,
  canDetect,
  polePairs,
  speedAvailable,
}: {
  c: CarrierGuideSpec;
  selected: string[];
  dispatch: Dispatch<GuidesAction>;
  canDetect: boolean;
  polePairs: number | null;
  speedAvailable: boolean;
}) {
  const [mText, setMText] = useState('1');
  const [nText, setNText] = useState('±1');
  const [centreText, setCentreText] = useState(String(c.centreHz));
  const families = parseFamilies(mText, nText);
  const mId = useId();
  const nId = useId();
  const title = c.source === 'detected' ? 'Detected carrier' : `Carrier ${c.centreHz} Hz`;
  const needsPoles = c.per === 'electrical' && c.families.some((f) => f.n !== 0) && !polePairs;
  return (
    <div className={`flex flex-col gap-2 rounded-md border border-ink-800 bg-ink-950/50 p-2.5 ${c.hidden ? 'opacity-60' : ''}`} data-testid="carrier-guide">
      <div className="flex items-center gap-2">
        <p className="text-xs font-medium text-mist-100">{title}</p>
        <button type="button" className={`${toolButtonClass()} ml-auto`} onClick={() => dispatch({ type: 'update-carrier', id: c.id, patch: { hidden: !c.hidden } })}>
          {c.hidden ? 'Show' : 'Hide'}
        </button>
        <button type="button" className={toolButtonClass()} aria-label={`Remove ${title}`} onClick={() => dispatch({ type: 'remove-carrier', id: c.id })}>
          Remove
        </button>
      </div>
      <div className="flex flex-wrap items-end gap-1.5">
        <select
          aria-label={`Centre of ${title}`}
          className={smallSelectClass}
          value={c.source}
          onChange={(e) => dispatch({ type: 'update-carrier', id: c.id, patch: { source: e.target.value as 'typed' | 'detected' } })}
        >
          <option value="typed">Typed centre</option>
          <option value="detected" disabled={!canDetect}>
            Detected (follows shifts)
          </option>
        </select>
        {c.source === 'typed' && (
          <input
            aria-label={`Centre frequency of ${title} (Hz)`}
            className={`${smallInputClass(!(parse(centreText) > 0))} w-20`}
            inputMode="decimal"
            value={centreText}
            onChange={(e) => {
              setCentreText(e.target.value);
              const v = parse(e.target.value);
              if (v > 0) dispatch({ type: 'update-carrier', id: c.id, patch: { centreHz: v } });
            }}
          />
        )}
        <select
          aria-label={`Sideband spacing of ${title}`}
          className={smallSelectClass}
          value={c.per}
          onChange={(e) => dispatch({ type: 'update-carrier', id: c.id, patch: { per: e.target.value as 'electrical' | 'shaft' } })}
        >
          <option value="electrical">n in electrical orders (fe)</option>
          <option value="shaft">k in shaft orders (fr)</option>
        </select>
      </div>
      <ul className="flex flex-col" aria-label={`Families of ${title}`}>
        {c.families.map((f) => {
          const id = familyLineId(c, f);
          return (
            <LineRow
              key={id}
              label={familyLabel(f.m, f.n, c.per)}
              detail={familyDetail(f.m, f.n, c.per)}
              kind="family"
              selected={selected.includes(id)}
              onToggle={() => dispatch({ type: 'toggle-selected', lineId: id })}
              onRemove={() => dispatch({ type: 'remove-family', id: c.id, family: f })}
            />
          );
        })}
      </ul>
      <form
        className="flex items-end gap-1.5"
        onSubmit={(e) => {
          e.preventDefault();
          for (const family of families ?? []) dispatch({ type: 'add-family', id: c.id, family });
        }}
      >
        <div className="flex flex-col gap-1">
          <label htmlFor={mId} className="text-[11px] text-mist-500">
            m
          </label>
          <input id={mId} className={`${smallInputClass()} w-10`} value={mText} onChange={(e) => setMText(e.target.value)} />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={nId} className="text-[11px] text-mist-500">
            {c.per === 'electrical' ? 'n' : 'k'}
          </label>
          <input id={nId} className={`${smallInputClass(families === null)} w-14`} value={nText} onChange={(e) => setNText(e.target.value)} title="A whole number; ±3 adds both signs" />
        </div>
        <button type="submit" className={toolButtonClass()} disabled={!families}>
          Add family
        </button>
      </form>
      {needsPoles && <p className="text-xs text-mist-500">The pole pairs are not known yet: only the m·fc lines are drawn.</p>}
      {!speedAvailable && c.families.some((f) => f.n !== 0) && <p className="text-xs text-mist-500">Sidebands need a speed: only the m·fc lines are drawn.</p>}
      {c.source === 'detected' && !canDetect && <p className="text-xs text-mist-500">Waiting for the carrier to be found.</p>}
    </div>
  );
}
