/**
 * Fanlight's theme, loaded from src/index.css with `@config`: the colour tokens of src/config/theme.ts
 * (canvases and SVG draw with the same ones); numbers and readouts in JetBrains Mono.
 */
import type { Config } from 'tailwindcss';
import { palette } from './src/config/theme';

export default {
  content: ['./src/**/*.{ts,tsx,html}'],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
