/** Command-line options of the load and crash scripts: --seconds N, --connections N, --rounds N. */
export interface RunOptions {
  seconds: number;
  connections: number;
  rounds: number;
}

const BOUNDS: Record<keyof RunOptions, [number, number]> = { seconds: [1, 600], connections: [1, 200], rounds: [1, 10] };

export function parseArgs(argv: string[], defaults: RunOptions): RunOptions {
  const out = { ...defaults };
  for (let i = 0; i < argv.length; i++) {
    const m = /^--(seconds|connections|rounds)(?:=(.*))?$/.exec(argv[i]);
    if (!m) throw new Error(`unknown option ${argv[i]} (use --seconds N, --connections N, --rounds N)`);
    const key = m[1] as keyof RunOptions;
    const raw = m[2] ?? argv[++i];
    const n = Number(raw);
    const [lo, hi] = BOUNDS[key];
    if (!Number.isInteger(n) || n < lo || n > hi) throw new Error(`--${key} must be a whole number from ${lo} to ${hi} (got ${raw})`);
    out[key] = n;
  }
  return out;
}
