/**
 * What is drawn over a map, the same on the Bench's canvas, on the view page's snapshot figure and in
 * the exported PNG: guides (orders solid, carrier families dashed, the tracked or chosen one in the
 * accent), marks (accent rings and boxes, dashed while not yet saved), the pinned moment, the pointer's
 * crosshair, and labels on a dark halo. Colours are the theme's tokens.
 */
import { palette, withAlpha } from '../../config/theme';

export const OVERLAY_FONT = '"JetBrains Mono", ui-monospace, monospace';

export const overlay = {
  /** The dark edge under every line and label, so it stands apart from the levels beneath */
  halo: palette.ink[950],
  labelBackground: withAlpha(palette.ink[950], 0.78),
  grid: 'rgba(255,255,255,0.07)',
  mark: palette.accent.DEFAULT,
  markHalo: withAlpha(palette.ink[950], 0.8),
  pinned: withAlpha(palette.accent.DEFAULT, 0.7),
  crosshair: withAlpha(palette.mist[100], 0.35),
  /** Where the sound is playing */
  playHead: palette.ok,
  /** The hearing model's tonal frequency */
  tonal: palette.mist[100],
  zoomBoxFill: withAlpha(palette.accent.DEFAULT, 0.12),
  zoomBoxStroke: withAlpha(palette.accent.DEFAULT, 0.9),
  text: palette.mist[100],
} as const;

/** A guide's colour: the accent when it is tracked or chosen, else by its kind. */
export const guideColour = (kind: 'order' | 'family', selected: boolean): string =>
  selected ? palette.accent.DEFAULT : kind === 'order' ? palette.guide.order : palette.guide.family;

/** A guide's dash pattern in CSS pixels: carrier families dashed, orders solid. */
export const guideDash = (kind: 'order' | 'family'): number[] => (kind === 'family' ? [6, 4] : []);

/** A mark's dash pattern in CSS pixels: dashed while waiting to be saved. */
export const markDash = (saved: boolean): number[] => (saved ? [] : [4, 3]);
