/** Parsing and checking the CLI's options: every bad value is a one-line UsageError (exit 2). */
import path from 'node:path';

export class UsageError extends Error {}

export interface Parsed {
  command: string;
  /** The first FILE, and all of them (only compare takes several) */
  file: string;
  files: string[];
  options: Record<string, string | true>;
  sequence: [string, string | true][];
}

export function parseArgs(argv: string[], usage: string, many = (_command: string) => false): Parsed {
  const [command, ...rest] = argv;
  if (!command) throw new UsageError(`Name a command. ${usage}`);
  const positional: string[] = [];
  const options: Record<string, string | true> = {};
  // every option in the order given, repeats included (extract's --order/--family list)
  const sequence: [string, string | true][] = [];
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (a.startsWith('--')) {
      const key = a.slice(2);
      const next = rest[i + 1];
      if (next !== undefined && !/^--[a-z]/.test(next)) {
        options[key] = next;
        sequence.push([key, next]);
        i++;
      } else {
        options[key] = true;
        sequence.push([key, true]);
      }
    } else positional.push(a);
  }
  if (many(command) ? positional.length < 1 : positional.length !== 1) throw new UsageError(`Give ${many(command) ? 'the FILEs' : 'exactly one FILE'}. ${usage}`);
  // npm runs scripts from the package folder; a relative path means the caller's folder.
  const files = positional.map((p) => path.resolve(process.env.INIT_CWD ?? process.cwd(), p));
  return { command, file: files[0], files, options, sequence };
}

export class Options {
  constructor(
    private readonly o: Record<string, string | true>,
    private readonly seq: [string, string | true][] = Object.entries(o),
  ) {}

  /** The values of the named options in the order given on the command line, repeats included. */
  sequence(keys: string[]): { key: string; value: string }[] {
    return this.seq
      .filter(([k]) => keys.includes(k))
      .map(([key, value]) => {
        if (value === true) throw new UsageError(`--${key} needs a value.`);
        return { key, value };
      });
  }

  has(key: string): boolean {
    return key in this.o;
  }

  string(key: string, fallback?: string): string {
    const v = this.o[key];
    if (v === undefined) {
      if (fallback === undefined) throw new UsageError(`--${key} is required.`);
      return fallback;
    }
    if (v === true) throw new UsageError(`--${key} needs a value.`);
    return v;
  }

  number(key: string, fallback?: number, check?: (n: number) => string | null): number {
    const raw = this.o[key];
    if (raw === undefined) {
      if (fallback === undefined) throw new UsageError(`--${key} is required.`);
      return fallback;
    }
    const n = raw === true ? NaN : Number(raw);
    if (!Number.isFinite(n)) throw new UsageError(`--${key} must be a number, not "${raw === true ? '' : raw}".`);
    const problem = check?.(n);
    if (problem) throw new UsageError(`--${key} ${problem}`);
    return n;
  }

  integer(key: string, fallback?: number, min = 0): number {
    return this.number(key, fallback, (n) => (Number.isInteger(n) && n >= min ? null : `must be a whole number of at least ${min}, not ${n}.`));
  }

  choice<T extends string>(key: string, choices: readonly T[], fallback: T): T {
    const v = this.string(key, fallback);
    if (!(choices as readonly string[]).includes(v)) throw new UsageError(`--${key} must be one of ${choices.join(', ')}, not "${v}".`);
    return v as T;
  }
}
