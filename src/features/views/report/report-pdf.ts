/**
 * A printable report of a saved view (A4, PDF, built with pdf-lib and the fonts the app ships): title,
 * project, recording and settings, the map snapshot with its guides and numbered marks, the tracks, the
 * findings, and each mark with its replies; date and author. Black on white with the map's perceptual
 * colour scale, so it reads in greyscale too. Pure apart from its inputs: the page hands it the map as PNG.
 */
import fontkit from '@pdf-lib/fontkit';
import { PDFDocument, rgb, type PDFFont, type PDFImage, type PDFPage } from 'pdf-lib';
import type { Mark, ThreadComment, ViewDetail } from '../../../../server/schemas/views';
import type { SnapshotHeader } from '../../../../workers/io/snapshot-format';
import type { RegisteredRecording } from '../../../../server/schemas/recordings';
import { axisTicks, axisTitle, formatAxisValue, fractionOf, type AxisSpec } from '../snapshot/axes';
import { guideLines } from '../snapshot/guide-lines';

export interface ReportFonts {
  regular: Uint8Array;
  bold: Uint8Array;
  mono: Uint8Array;
}

export interface ReportInput {
  view: ViewDetail;
  projectName: string;
  recording: RegisteredRecording | null;
  header: SnapshotHeader | null;
  /** The snapshot's map as a PNG, row 0 at the top (high y). */
  mapPng: Uint8Array | null;
  marks: { mark: Mark; replies: ThreadComment[] }[];
  generatedAt: Date;
  generatedBy: string;
  fonts: ReportFonts;
}

const A4: [number, number] = [595.28, 841.89];
const MARGIN = 48;
const INK = rgb(0.1, 0.1, 0.12);
const SOFT = rgb(0.38, 0.38, 0.42);
const RULE = rgb(0.75, 0.75, 0.78);
const GUIDE = rgb(1, 1, 1);

/** Text the shipped font can draw: arrows and the like become their plain-text equivalents. */
function drawable(font: PDFFont, text: string): string {
  const known = new Set(font.getCharacterSet());
  const swaps: Record<string, string> = { '\u2192': '->', '\u2190': '<-', '\u2248': '~', '\u2264': '<=', '\u2265': '>=', '\u00b7': '*' };
  let out = '';
  for (const ch of text.replace(/\s+/g, ' ')) {
    const cp = ch.codePointAt(0)!;
    out += known.has(cp) ? ch : (swaps[ch] ?? '?');
  }
  return out;
}

/** Lays out text top to bottom across pages, wrapping words to the page width. */
class Flow {
  page: PDFPage;
  y: number;
  constructor(
    private readonly doc: PDFDocument,
    private readonly fonts: { regular: PDFFont; bold: PDFFont; mono: PDFFont },
  ) {
    this.page = doc.addPage(A4);
    this.y = A4[1] - MARGIN;
  }

  newPage(): void {
    this.page = this.doc.addPage(A4);
    this.y = A4[1] - MARGIN;
  }

  need(height: number): void {
    if (this.y - height < MARGIN) this.newPage();
  }

  text(text: string, { size = 10, font = this.fonts.regular, colour = INK, indent = 0, gap = 3 } = {}): void {
    const width = A4[0] - 2 * MARGIN - indent;
    const words = drawable(font, text).split(' ');
    let line = '';
    const lines: string[] = [];
    for (const w of words) {
      const next = line ? `${line} ${w}` : w;
      if (font.widthOfTextAtSize(next, size) > width && line) {
        lines.push(line);
        line = w;
      } else line = next;
    }
    if (line) lines.push(line);
    for (const l of lines) {
      this.need(size + gap);
      this.y -= size;
      this.page.drawText(l, { x: MARGIN + indent, y: this.y, size, font, color: colour });
      this.y -= gap;
    }
  }

  heading(text: string): void {
    this.need(30);
    this.y -= 8;
    this.text(text, { size: 12, font: this.fonts.bold, gap: 5 });
  }

  rule(): void {
    this.need(8);
    this.y -= 4;
    this.page.drawLine({ start: { x: MARGIN, y: this.y }, end: { x: A4[0] - MARGIN, y: this.y }, thickness: 0.5, color: RULE });
    this.y -= 4;
  }
}

function settingsLine(view: ViewDetail): string {
  const p = view.state.processing;
  const parts = [
    `map against ${p.against}`,
    `channel ${p.channelIndex + 1}`,
    `${p.window} window`,
    `block ${p.blockSize}`,
    `${Math.round(p.overlap * 100)} % overlap`,
    `${p.scaling.toUpperCase()} scaling`,
    `weighting ${p.weighting}`,
  ];
  if (view.state.polePairs) parts.push(`${view.state.polePairs} pole pairs`);
  return parts.join(', ');
}

/** The map with frame, ticks, guide lines and numbered marks, in a box of the given size. */
function drawMap(flow: Flow, input: ReportInput, image: PDFImage, fonts: { regular: PDFFont; mono: PDFFont }): void {
  const header = input.header!;
  const ax = header.axes as { x: AxisSpec; y: AxisSpec };
  const w = A4[0] - 2 * MARGIN - 44;
  const h = Math.min(300, w * 0.62);
  flow.need(h + 52);
  const x0 = MARGIN + 40;
  const y0 = flow.y - 14 - h; // room for the y axis title above the frame
  const page = flow.page;
  page.drawImage(image, { x: x0, y: y0, width: w, height: h });
  page.drawRectangle({ x: x0, y: y0, width: w, height: h, borderColor: INK, borderWidth: 0.6 });
  const toPage = (x: number, y: number): [number, number] => [x0 + fractionOf(ax.x, x) * w, y0 + fractionOf(ax.y, y) * h];
  const inside = ([px, py]: [number, number]) => px >= x0 - 0.5 && px <= x0 + w + 0.5 && py >= y0 - 0.5 && py <= y0 + h + 0.5;
  for (const line of guideLines(input.view.state, ax)) {
    if (!line.visible) continue;
    for (const poly of line.polylines) {
      for (let i = 1; i < poly.length; i++) {
        const a = toPage(poly[i - 1][0], poly[i - 1][1]);
        const b = toPage(poly[i][0], poly[i][1]);
        if (inside(a) && inside(b)) page.drawLine({ start: { x: a[0], y: a[1] }, end: { x: b[0], y: b[1] }, thickness: 0.5, color: GUIDE, dashArray: [3, 2], opacity: 0.8 });
      }
    }
  }
  input.marks.forEach(({ mark }, i) => {
    const g = mark.geometry as { x?: number; y?: number; x0?: number; x1?: number; y0?: number; y1?: number };
    let at: [number, number] | null = null;
    if (mark.kind === 'point' && g.x !== undefined && g.y !== undefined) at = toPage(g.x, g.y);
    if (mark.kind === 'box' && g.x0 !== undefined) {
      const a = toPage(g.x0, g.y0!);
      const b = toPage(g.x1!, g.y1!);
      page.drawRectangle({ x: a[0], y: a[1], width: b[0] - a[0], height: b[1] - a[1], borderColor: GUIDE, borderWidth: 1 });
      at = b;
    }
    if (!at || !inside(at)) return;
    page.drawCircle({ x: at[0], y: at[1], size: 7, color: rgb(1, 1, 1), borderColor: INK, borderWidth: 0.8 });
    const label = String(i + 1);
    page.drawText(label, { x: at[0] - fonts.mono.widthOfTextAtSize(label, 8) / 2, y: at[1] - 2.8, size: 8, font: fonts.mono, color: INK });
  });
  // axisTicks gives `at` as the fraction of the axis
  for (const t of axisTicks(ax.x, 6)) {
    const px = x0 + t.at * w;
    page.drawLine({ start: { x: px, y: y0 }, end: { x: px, y: y0 - 3 }, thickness: 0.5, color: INK });
    page.drawText(drawable(fonts.mono, t.label), { x: px - fonts.mono.widthOfTextAtSize(t.label, 7) / 2, y: y0 - 12, size: 7, font: fonts.mono, color: SOFT });
  }
  for (const t of axisTicks(ax.y, 6)) {
    const py = y0 + t.at * h;
    page.drawLine({ start: { x: x0, y: py }, end: { x: x0 - 3, y: py }, thickness: 0.5, color: INK });
    page.drawText(drawable(fonts.mono, t.label), { x: x0 - 5 - fonts.mono.widthOfTextAtSize(t.label, 7), y: py - 2.5, size: 7, font: fonts.mono, color: SOFT });
  }
  const xTitle = drawable(fonts.regular, axisTitle(ax.x));
  page.drawText(xTitle, { x: x0 + w / 2 - fonts.regular.widthOfTextAtSize(xTitle, 8) / 2, y: y0 - 24, size: 8, font: fonts.regular, color: SOFT });
  const yTitle = drawable(fonts.regular, axisTitle(ax.y));
  page.drawText(yTitle, { x: x0, y: y0 + h + 5, size: 8, font: fonts.regular, color: SOFT });
  flow.y = y0 - 32;
  flow.text(
    `Levels: ${header.dbTop - header.dbRange} to ${header.dbTop} dB over the colour scale (light = high). Dashed white: the guides the view can draw against this axis; numbers: the marks.`,
    { size: 8, colour: SOFT },
  );
}

/** One small line plot per track, against the map's x axis. */
function drawTracks(flow: Flow, header: SnapshotHeader, fonts: { regular: PDFFont; mono: PDFFont }): void {
  const tracks = (header.tracks ?? []).filter((t) => t.points.some((p) => p[1] !== null));
  if (!tracks.length) return;
  flow.heading('Tracks');
  const ax = (header.axes as { x: AxisSpec }).x;
  for (const track of tracks.slice(0, 6)) {
    const values = track.points.map((p) => p[1]).filter((v): v is number => v !== null);
    const lo = Math.min(...values);
    const hi = Math.max(...values);
    const span = hi - lo || 1;
    const w = A4[0] - 2 * MARGIN - 44;
    const h = 70;
    flow.need(h + 30);
    flow.text(`${track.name} (${track.unit}), ${formatAxisValue(ax, ax.from)} to ${formatAxisValue(ax, ax.to)}: ${lo.toFixed(1)} to ${hi.toFixed(1)}`, {
      size: 8,
      colour: SOFT,
    });
    const x0 = MARGIN + 40;
    const y0 = flow.y - h;
    flow.page.drawRectangle({ x: x0, y: y0, width: w, height: h, borderColor: RULE, borderWidth: 0.5 });
    let prev: [number, number] | null = null;
    for (const [x, v] of track.points) {
      if (v === null) {
        prev = null;
        continue;
      }
      const p: [number, number] = [x0 + fractionOf(ax, x) * w, y0 + ((v - lo) / span) * h];
      if (prev) flow.page.drawLine({ start: { x: prev[0], y: prev[1] }, end: { x: p[0], y: p[1] }, thickness: 0.8, color: INK });
      prev = p;
    }
    flow.page.drawText(hi.toFixed(1), { x: MARGIN, y: y0 + h - 7, size: 7, font: fonts.mono, color: SOFT });
    flow.page.drawText(lo.toFixed(1), { x: MARGIN, y: y0, size: 7, font: fonts.mono, color: SOFT });
    flow.y = y0 - 10;
  }
}

export async function buildViewReport(input: ReportInput): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  const fonts = {
    regular: await doc.embedFont(input.fonts.regular, { subset: true }),
    bold: await doc.embedFont(input.fonts.bold, { subset: true }),
    mono: await doc.embedFont(input.fonts.mono, { subset: true }),
  };
  const { view } = input;
  doc.setTitle(view.title);
  doc.setSubject(`A view of ${input.projectName}`);
  doc.setCreator('Fanlight');
  doc.setProducer('Fanlight (pdf-lib)');
  doc.setCreationDate(input.generatedAt);

  const flow = new Flow(doc, fonts);
  flow.text(view.title, { size: 16, font: fonts.bold, gap: 6 });
  flow.text(`${input.projectName} · saved by ${view.author?.name ?? 'someone'} on ${view.updatedAt.slice(0, 10)}`, { size: 9, colour: SOFT });
  flow.text(`Report made by ${input.generatedBy} on ${input.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`, { size: 9, colour: SOFT });
  flow.rule();
  const r = input.recording;
  flow.text(
    r
      ? `Recording: ${r.name}, ${r.sampleRateHz} Hz, ${r.durationS.toFixed(2)} s, channels: ${r.channels.map((c) => `${c.index + 1} ${c.name} (${c.unit})`).join('; ')}`
      : 'Recording: not registered with the project.',
    { size: 9 },
  );
  flow.text(`Settings: ${settingsLine(view)}.`, { size: 9 });
  const carriers = view.state.carrierSchedule.map((s) => `${s.carrierHz} Hz from ${s.fromS.toFixed(1)} s`).join(', then ');
  if (carriers) flow.text(`Carrier schedule: ${carriers}.`, { size: 9 });

  if (input.header && input.mapPng) {
    flow.heading('Map');
    drawMap(flow, input, await doc.embedPng(input.mapPng), fonts);
  } else {
    flow.text('This view has no snapshot.', { size: 9, colour: SOFT });
  }

  flow.heading('Findings');
  const findings = input.header?.findings ?? [];
  if (!findings.length) flow.text('No findings were saved with this view.', { size: 9, colour: SOFT });
  for (const f of findings) flow.text(`${f.kind}: ${f.summary}`, { size: 9 });

  if (input.header) drawTracks(flow, input.header, fonts);

  flow.heading('Marks and replies');
  if (!input.marks.length) flow.text('No marks.', { size: 9, colour: SOFT });
  input.marks.forEach(({ mark, replies }, i) => {
    flow.need(40);
    flow.text(`${i + 1}. ${mark.text || '(no text)'}`, { size: 10, font: fonts.bold });
    flow.text(`${mark.kind} mark by ${mark.author?.name ?? 'someone'}, ${mark.createdAt.slice(0, 10)}`, { size: 8, colour: SOFT, indent: 12 });
    for (const c of replies) flow.text(`${c.author.name}: ${c.body}`, { size: 9, indent: 12 });
  });
  return doc.save();
}
