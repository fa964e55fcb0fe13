/** Plain-text tables for the benchmark output. */
export type Cell = string | number;

/** Where the tables go: stdout, or stderr when `--json` keeps stdout for the JSON object. */
let tableStream: NodeJS.WritableStream = process.stdout;

export function sendTablesTo(stream: NodeJS.WritableStream): void {
  tableStream = stream;
}

function show(value: Cell): string {
  if (typeof value === 'string') return value;
  if (!Number.isFinite(value)) return 'n/a';
  return Math.abs(value) >= 100 ? value.toFixed(0) : Number(value.toPrecision(3)).toString();
}

/** Prints a title and a table with aligned columns to stdout. */
export function printTable(title: string, header: string[], rows: Cell[][]): void {
  const text = [header, ...rows.map((row) => row.map(show))];
  const widths = header.map((_, column) => Math.max(...text.map((row) => row[column].length)));
  const line = (row: string[]): string => row.map((cell, column) => cell.padEnd(widths[column])).join('  ');
  tableStream.write(`\n${title}\n${line(text[0])}\n${widths.map((w) => '-'.repeat(w)).join('  ')}\n`);
  for (const row of text.slice(1)) tableStream.write(`${line(row)}\n`);
}

/** Wall time of fn in seconds: the best of `repeats` runs. */
export function bestSeconds(fn: () => void, repeats = 3): number {
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const start = process.hrtime.bigint();
    fn();
    best = Math.min(best, Number(process.hrtime.bigint() - start) / 1e9);
  }
  return best;
}

/** Wall time of an async fn in seconds: the best of `repeats` runs. */
export async function bestSecondsAsync(fn: () => Promise<unknown>, repeats = 2): Promise<number> {
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const start = process.hrtime.bigint();
    await fn();
    best = Math.min(best, Number(process.hrtime.bigint() - start) / 1e9);
  }
  return best;
}

export function pass(ok: boolean): string {
  return ok ? 'met' : 'NOT met';
}
