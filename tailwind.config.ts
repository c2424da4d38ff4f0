/**
 * Fanlight's theme tokens, loaded from src/index.css with `@config`. A calm dark workbench for long
 * sessions with one accent colour (lamp amber); numbers and readouts in JetBrains Mono.
 */
import type { Config } from 'tailwindcss';

export default {
  content: ['./src/**/*.{ts,tsx,html}'],
  theme: {
    extend: {
      colors: {
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
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
