/**
 * Fanlight's colour tokens: the one source for Tailwind's classes (tailwind.config.ts names them as CSS
 * variables, themeCss() gives their values) and for what is drawn on canvases and in SVG (the map, the
 * snapshot figure, the plots, the exported PNG and PDF). A calm dark workbench for long sessions with one
 * accent colour (lamp amber), and a light one beside it for bright rooms and print-like reading. The
 * maps keep their perceptual colour scales in both.
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

/** The light theme: the same tokens, surfaces light and text dark; the accent darkened to keep its contrast. */
export const lightPalette: typeof palette = {
  ink: {
    950: '#eef1f5',
    900: '#ffffff',
    850: '#f5f7fa',
    800: '#dde3ea',
    700: '#c5cdd8',
    600: '#a3aebd',
  },
  mist: {
    100: '#121821',
    300: '#364152',
    500: '#5d697b',
  },
  accent: {
    DEFAULT: '#b96f0c',
    strong: '#8f5200',
    dim: '#e8c58f',
  },
  danger: '#c0333b',
  ok: '#1d7f55',
  guide: palette.guide,
} as unknown as typeof palette;

export type ThemeName = 'dark' | 'light';

/** Every token as [CSS variable name, dark value, light value]: "--c-ink-950". */
function tokens(): [string, string, string][] {
  const out: [string, string, string][] = [];
  const walk = (dark: Record<string, unknown>, light: Record<string, unknown>, prefix: string) => {
    for (const [k, v] of Object.entries(dark)) {
      const name = k === 'DEFAULT' ? prefix : `${prefix}-${k}`;
      if (typeof v === 'string') out.push([`--c${name}`, v, String(light[k])]);
      else walk(v as Record<string, unknown>, light[k] as Record<string, unknown>, name);
    }
  };
  walk(palette, lightPalette, '');
  return out;
}

/** Tailwind's colours as CSS variables with the same names as the palette (tailwind.config.ts). */
export function paletteAsVariables(): Record<string, unknown> {
  const map = (v: Record<string, unknown>, prefix: string): Record<string, unknown> =>
    Object.fromEntries(Object.entries(v).map(([k, x]) => [k, typeof x === 'string' ? `var(--c${k === 'DEFAULT' ? prefix : `${prefix}-${k}`})` : map(x as Record<string, unknown>, `${prefix}-${k}`)]));
  return map(palette, '');
}

/** The variables' values: dark on :root, light under [data-theme="light"]. */
export function themeCss(): string {
  const t = tokens();
  return `:root{${t.map(([n, d]) => `${n}:${d}`).join(';')}}\n:root[data-theme="light"]{color-scheme:light;${t.map(([n, , l]) => `${n}:${l}`).join(';')}}`;
}

/** A token's colour in the theme shown now (for canvases and plots, which cannot read CSS variables). */
export function themeColour(pick: (p: typeof palette) => string): string {
  return typeof document !== 'undefined' && document.documentElement.dataset.theme === 'light' ? pick(lightPalette) : pick(palette);
}

/** Series in a plot, in the order they are given out: the accent first. */
export const seriesColours = ['#f0a93e', '#7fa7d4', '#5cc99a', '#c59ee0', '#e3d47a', '#6fc3c9', '#e48a8a', '#a9b4c4'] as const;

/** A colour with an alpha, for canvas strokes and fills. */
export function withAlpha(hex: string, alpha: number): string {
  const v = parseInt(hex.slice(1), 16);
  return `rgba(${(v >> 16) & 255},${(v >> 8) & 255},${v & 255},${alpha})`;
}
