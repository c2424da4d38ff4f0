/**
 * The map as one picture: the painted levels and the guides as they are on screen, with both axes,
 * the grid labels, the colour bar in the map's unit and a title line, drawn onto one canvas in device
 * pixels and encoded as PNG.
 */
import type { AxisTicks } from '../../../components/plot/map-axes';
import { lutCss } from '../../../lib/plot/colour-scales';
import { ticks } from '../../../lib/plot/axis-ticks';
import { palette } from '../../../config/theme';

export interface ComposeInput {
  map: HTMLCanvasElement;
  guides: HTMLCanvasElement;
  left: AxisTicks;
  bottom: AxisTicks;
  lut: Uint8Array;
  topDb: number;
  rangeDb: number;
  /** "dB re 1 µm/s²" */
  scaleLabel: string;
  title: string;
  subtitle: string;
  dpr: number;
}

const MONO = '"JetBrains Mono", ui-monospace, monospace';
const SANS = 'Inter, system-ui, sans-serif';

export function composeMap(input: ComposeInput): HTMLCanvasElement {
  const { map, guides, dpr } = input;
  const s = (v: number) => Math.round(v * dpr);
  const left = s(72);
  const top = s(46);
  const right = s(96);
  const bottom = s(46);
  const W = map.width;
  const H = map.height;
  const canvas = document.createElement('canvas');
  canvas.width = left + W + right;
  canvas.height = top + H + bottom;
  const ctx = canvas.getContext('2d')!;
  ctx.fillStyle = palette.ink[950];
  ctx.fillRect(0, 0, canvas.width, canvas.height);

  ctx.fillStyle = palette.mist[100];
  ctx.font = `600 ${s(13)}px ${SANS}`;
  ctx.textBaseline = 'alphabetic';
  ctx.fillText(input.title, left, s(20));
  ctx.fillStyle = palette.mist[500];
  ctx.font = `${s(11)}px ${MONO}`;
  ctx.fillText(input.subtitle, left, s(36));

  ctx.fillStyle = palette.ink[950];
  ctx.fillRect(left, top, W, H);
  ctx.drawImage(map, left, top);
  ctx.drawImage(guides, left, top);
  ctx.strokeStyle = palette.ink[700];
  ctx.lineWidth = 1;
  ctx.strokeRect(left - 0.5, top - 0.5, W + 1, H + 1);

  ctx.fillStyle = palette.mist[300];
  ctx.strokeStyle = palette.ink[600];
  ctx.font = `${s(11)}px ${MONO}`;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const t of input.left.items) {
    const y = top + H - t.at * H;
    ctx.beginPath();
    ctx.moveTo(left - s(6), Math.round(y) + 0.5);
    ctx.lineTo(left, Math.round(y) + 0.5);
    ctx.stroke();
    ctx.fillText(t.label, left - s(9), y);
  }
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const t of input.bottom.items) {
    const x = left + t.at * W;
    ctx.beginPath();
    ctx.moveTo(Math.round(x) + 0.5, top + H);
    ctx.lineTo(Math.round(x) + 0.5, top + H + s(6));
    ctx.stroke();
    ctx.fillText(t.label, x, top + H + s(9));
  }
  ctx.fillStyle = palette.mist[500];
  ctx.font = `${s(12)}px ${SANS}`;
  ctx.fillText(input.bottom.title, left + W / 2, top + H + s(26));
  ctx.save();
  ctx.translate(s(14), top + H / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textBaseline = 'middle';
  ctx.fillText(input.left.title, 0, 0);
  ctx.restore();

  // the colour bar, floor at the bottom
  const bx = left + W + s(16);
  const bw = s(12);
  const grad = ctx.createLinearGradient(0, top + H, 0, top);
  for (let i = 0; i <= 16; i++) grad.addColorStop(i / 16, lutCss(input.lut, Math.round((i * 255) / 16)));
  ctx.fillStyle = grad;
  ctx.fillRect(bx, top, bw, H);
  ctx.strokeStyle = palette.ink[700];
  ctx.strokeRect(bx - 0.5, top - 0.5, bw + 1, H + 1);
  ctx.fillStyle = palette.mist[300];
  ctx.font = `${s(11)}px ${MONO}`;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  const floor = input.topDb - input.rangeDb;
  for (const v of ticks(floor, input.topDb, 7)) {
    const y = top + ((input.topDb - v) / input.rangeDb) * H;
    ctx.fillText(Number.isInteger(v) ? String(v) : v.toFixed(1), bx + bw + s(5), y);
  }
  ctx.fillStyle = palette.mist[500];
  ctx.font = `${s(11)}px ${SANS}`;
  ctx.textBaseline = 'bottom';
  ctx.fillText(input.scaleLabel, left + W + s(8), top - s(6));
  return canvas;
}

export const canvasToPng = (canvas: HTMLCanvasElement) =>
  new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The picture could not be made.'))), 'image/png'));
