import { readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../../../server/config';
import { migrations } from '../../../server/db/migration-source';

describe('migration source', () => {
  it('lists every file in migrations/, in file-name order', () => {
    const files = readdirSync(path.join(PROJECT_ROOT, 'migrations'))
      .filter((f) => f.endsWith('.ts'))
      .map((f) => f.replace(/\.ts$/, ''))
      .sort();
    expect(migrations.map((m) => m.name)).toEqual(files);
  });

  it('gives each migration an up and a down', () => {
    for (const m of migrations) {
      expect(typeof m.module.up, m.name).toBe('function');
      expect(typeof m.module.down, m.name).toBe('function');
    }
  });
});
