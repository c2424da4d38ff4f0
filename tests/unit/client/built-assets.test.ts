/**
 * Nothing the app loads may come from another host: fonts ship with the app, no CDN. Reads the build
 * that `npm test` made before the tests ran.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config';

const dist = loadConfig({ ...process.env, NODE_ENV: 'test' }).clientDir;

function files(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? files(path.join(dir, e.name)) : [path.join(dir, e.name)],
  );
}

describe('built client', () => {
  it('exists (npm test builds it first)', () => {
    expect(existsSync(path.join(dist, 'index.html'))).toBe(true);
  });

  it('ships its own font files', () => {
    const fonts = files(dist).filter((f) => /\.(woff2?|ttf)$/.test(f)).map((f) => path.basename(f));
    expect(fonts.some((f) => /jetbrains-mono/i.test(f))).toBe(true);
    expect(fonts.some((f) => /inter/i.test(f))).toBe(true);
  });

  it('names no external font or CDN address in HTML or CSS', () => {
    const texts = files(dist)
      .filter((f) => /\.(html|css)$/.test(f))
      .map((f) => [f, readFileSync(f, 'utf8')] as const);
    for (const [file, text] of texts) {
      expect(text, file).not.toMatch(/https?:\/\/[^\s"')]*(fonts\.|cdn|unpkg|jsdelivr|googleapis|gstatic)/i);
      expect(text, file).not.toMatch(/@import\s+url\(\s*['"]?https?:/i);
      expect(text, file).not.toMatch(/url\(\s*['"]?(https?:)?\/\//i);
    }
  });

  it('loads no script from another host', () => {
    const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
    for (const m of html.matchAll(/<(?:script|link)[^>]+(?:src|href)="([^"]+)"/g)) {
      expect(m[1], 'index.html').toMatch(/^\/(?!\/)/);
    }
  });
});
