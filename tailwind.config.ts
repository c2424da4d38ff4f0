/**
 * Fanlight's theme, loaded from src/index.css with `@config`: the colour tokens of src/config/theme.ts as
 * CSS variables (their dark and light values come from the same file, see themeCss), so one set of
 * classes serves both themes; numbers and readouts in JetBrains Mono.
 */
import type { Config } from 'tailwindcss';
import { paletteAsVariables } from './src/config/theme';

export default {
  content: ['./src/**/*.{ts,tsx,html}'],
  theme: {
    extend: {
      colors: paletteAsVariables(),
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
