/**
 * A campaign's PRESET.json: the `inverter` command's options as one JSON object (camelCase keys), checked
 * by zod and turned into the command-line options every file is analysed with.
 */
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { inverterOptions } from '../commands/inverter';
import { Options, UsageError } from '../options';

const index = z.number().int().min(0);
const family = z.union([z.string().regex(/^\d+:-?\d+$/), z.object({ m: z.number().int().min(1), n: z.number().int() }).strict()]);

export const presetSchema = z
  .object({
    channel: index,
    tacho: index.optional(),
    ppr: z.number().int().min(1).optional(),
    trigger: z.number().optional(),
    speedChannel: index.optional(),
    speedCal: z.number().optional(),
    polePairs: z.number().int().min(1).optional(),
    orders: z.union([z.array(z.number().positive()), z.string()]).optional(),
    families: z.union([z.array(family), z.string()]).optional(),
    cal: z.number().optional(),
    quantity: z.enum(['acceleration', 'velocity', 'sound-pressure', 'voltage', 'other']).optional(),
    soundPressure: z.boolean().optional(),
    block: z.number().int().min(256).optional(),
    at: z.number().min(0).optional(),
  })
  .strict();

export type Preset = z.infer<typeof presetSchema>;

/** The inverter command's flag for each preset key (camelCase → --kebab-case). */
const FLAG: Record<keyof Preset, string> = {
  channel: 'channel',
  tacho: 'tacho',
  ppr: 'ppr',
  trigger: 'trigger',
  speedChannel: 'speed-channel',
  speedCal: 'speed-cal',
  polePairs: 'pole-pairs',
  orders: 'orders',
  families: 'families',
  cal: 'cal',
  quantity: 'quantity',
  soundPressure: 'sound-pressure',
  block: 'block',
  at: 'at',
};

/** Checks a parsed preset; every problem is one sentence naming the file and the key. */
export function parsePreset(value: unknown, where: string): Preset {
  const r = presetSchema.safeParse(value);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  if (issue.code === 'unrecognized_keys') {
    throw new UsageError(`${where}: unknown key "${issue.keys[0]}" (known: ${Object.keys(FLAG).join(', ')}).`);
  }
  const key = issue.path.join('.') || '(the whole preset)';
  throw new UsageError(`${where}: "${key}" ${issue.message.replace(/\.$/, '').toLowerCase()}.`);
}

export function readPreset(file: string): Preset {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new UsageError(`--preset ${file} cannot be read.`);
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw new UsageError(`${file} is not JSON (${(e as Error).message}).`);
  }
  return parsePreset(value, file);
}

/** The preset as the inverter command's options, so each file is read exactly as `analyze inverter` reads it. */
export function presetOptions(preset: Preset): Record<string, string | true> {
  const o: Record<string, string | true> = {};
  for (const [key, value] of Object.entries(preset) as [keyof Preset, unknown][]) {
    if (value === undefined || value === false) continue;
    const flag = FLAG[key];
    if (value === true) o[flag] = true;
    else if (Array.isArray(value)) o[flag] = value.map((v) => (typeof v === 'object' ? `${v.m}:${v.n}` : String(v))).join(',');
    else o[flag] = String(value);
  }
  return o;
}

/** Checks now, once, what would otherwise fail on every file (the speed source, list syntax). */
export function checkPresetOptions(options: Record<string, string | true>, where: string): void {
  const o = new Options(options);
  if (o.has('tacho') === o.has('speed-channel')) throw new UsageError(`${where}: give either "tacho" with "ppr" or "speedChannel".`);
  if (o.has('tacho') && !o.has('ppr')) throw new UsageError(`${where}: "tacho" needs "ppr" (pulses per revolution).`);
  try {
    inverterOptions(o);
  } catch (e) {
    if (e instanceof UsageError) throw new UsageError(`${where}: ${e.message}`);
    throw e;
  }
}
