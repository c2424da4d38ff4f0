/**
 * Fanlight's colour tokens: the one source for Tailwind's classes (tailwind.config.ts reads them) and for
 * what is drawn on canvases and in SVG (the map, the snapshot figure, the plots, the exported PNG and PDF).
 * A calm dark workbench for long sessions with one accent colour (lamp amber).
 */
export const palette = {
  // Surfaces, darkest to lightest.
  ink: {
    950: '#0d1117',
    900: '#121821',
    850: '#171e29',
    800: '#1d2533',
    700: '#2a3445',
    600: '#3b475b',
  },
  // Text on the dark surfaces.
  mist: {
    100: '#e8edf4',
    300: '#b6c0cf',
    500: '#8793a6',
  },
  accent: {
    DEFAULT: '#f0a93e',
    strong: '#ffbe5c',
    dim: '#8a6224',
  },
  danger: '#f0656b',
  ok: '#5cc99a',
  // Lines drawn over a map: order guides, carrier families, and a quiet blue for plotted levels.
  guide: {
    order: '#7fa7d4',
    family: '#aab4c4',
    level: '#5f86b3',
  },
} as const;

/** Series in a plot, in the order they are given out: the accent first. */
export const seriesColours = ['#f0a93e', '#7fa7d4', '#5cc99a', '#c59ee0', '#e3d47a', '#6fc3c9', '#e48a8a', '#a9b4c4'] as const;

/** A colour with an alpha, for canvas strokes and fills. */
export function withAlpha(hex: string, alpha: number): string {
  const v = parseInt(hex.slice(1), 16);
  return `rgba(${(v >> 16) & 255},${(v >> 8) & 255},${v & 255},${alpha})`;
}
