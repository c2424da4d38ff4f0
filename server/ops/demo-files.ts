import type { AppConfig } from '../config';
import { ensureDemoRecordings } from '../../seeds/demo-recordings';

/** Writes the demo's synthesised recordings once (deterministic; a second start reuses them). */
export function prepareDemoRecordings(config: AppConfig): void {
  const t0 = Date.now();
  ensureDemoRecordings(config.demoRecordingsDir);
  const s = ((Date.now() - t0) / 1000).toFixed(1);
  if (Date.now() - t0 > 200) console.log(`fanlight: wrote the demo recordings (${s} s)`);
}
