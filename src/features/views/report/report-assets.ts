/**
 * What the report needs from the page: the shipped fonts (the same files the app shows, fetched from our
 * own assets, never from another host) and the map drawn as a PNG with the view's colour scale.
 */
import interBold from '@fontsource/inter/files/inter-latin-600-normal.woff?url';
import interRegular from '@fontsource/inter/files/inter-latin-400-normal.woff?url';
import monoRegular from '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff?url';
import { colourLut } from '../../../lib/plot/colour-scales';
import type { DecodedSnapshot } from '../api/snapshot';
import { scaleOrDefault } from '../../../lib/plot/colour-scales';
import { mapPixels } from '../snapshot/paint';
import type { ReportFonts } from './report-pdf';

async function bytesOf(url: string): Promise<Uint8Array> {
  const res = await fetch(url);
  if (!res.ok) throw new Error(`A report font could not be loaded (${res.status}).`);
  return new Uint8Array(await res.arrayBuffer());
}

export async function reportFonts(): Promise<ReportFonts> {
  const [regular, bold, mono] = await Promise.all([bytesOf(interRegular), bytesOf(interBold), bytesOf(monoRegular)]);
  return { regular, bold, mono };
}

/** The snapshot's map as PNG bytes, high y at the top, in the view's colour scale. */
export async function mapPng(snapshot: DecodedSnapshot, colourScale: string): Promise<Uint8Array> {
  const { width, height } = snapshot.header;
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('This browser cannot draw the map for the report.');
  ctx.putImageData(new ImageData(mapPixels(snapshot.map, width, height, colourLut(scaleOrDefault(colourScale))), width, height), 0, 0);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
  if (!blob) throw new Error('The map could not be turned into an image for the report.');
  return new Uint8Array(await blob.arrayBuffer());
}
