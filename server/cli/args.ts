/**
 * Option parsing shared by the commands, on node:util parseArgs (strict: unknown options and missing values are
 * usage errors, exit 2), plus validators that turn option text into checked numbers (GS_ERR_PARAMETER, exit 1).
 */
import { parseArgs } from 'node:util';
import { parameterError } from '../errors.js';
import { CELL_SHAPES, isCellShape, type CellShape } from '../../workers/lattice/cell-shape.js';
import { PLAN_LIMITS, PLAN_RANGE_WORDS } from '../../shared/plan-rules.js';

export interface OptionSpec {
  type: 'string' | 'boolean';
  multiple?: boolean;
  /** placeholder in help, e.g. 'FILE', 'M' */
  value?: string;
  description: string;
}

export type OptionSpecs = Record<string, OptionSpec>;
export type OptionValues = Record<string, string | boolean | string[] | undefined>;

/** A command line that cannot be understood (unknown command or option, missing value): exit code 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

const HELP: OptionSpec = { type: 'boolean', description: 'show this help' };

export function parseOptions(argv: string[], specs: OptionSpecs): OptionValues {
  const options: Record<string, { type: 'string' | 'boolean'; multiple?: boolean }> = { help: { type: 'boolean' } };
  for (const [name, spec] of Object.entries(specs)) {
    options[name] = spec.multiple === true ? { type: spec.type, multiple: true } : { type: spec.type };
  }
  try {
    const { values, positionals } = parseArgs({ args: argv, options, strict: true, allowPositionals: true });
    if (positionals.length > 0) throw new UsageError(`unexpected argument '${positionals[0]}'`);
    return values as OptionValues;
  } catch (error) {
    const code = (error as { code?: unknown }).code;
    if (!(error instanceof UsageError) && !(typeof code === 'string' && code.startsWith('ERR_PARSE_ARGS'))) throw error;
    if (error instanceof UsageError) throw error;
    const message = error instanceof Error ? error.message : String(error);
    throw new UsageError(message.replace(/\. To specify a positional argument.*$/s, ''));
  }
}

/** Help text of a command's options, one per line. */
export function optionHelp(specs: OptionSpecs): string {
  const rows = Object.entries({ ...specs, help: HELP }).map(([name, spec]) => {
    const flag = `--${name}${spec.type === 'string' ? ` ${spec.value ?? 'VALUE'}` : ''}`;
    return `  ${flag.padEnd(24)} ${spec.description}${spec.multiple ? ' (repeatable)' : ''}`;
  });
  return rows.join('\n');
}

export function requireString(values: OptionValues, name: string): string {
  const value = values[name];
  if (typeof value !== 'string' || value === '') throw new UsageError(`--${name} is required`);
  return value;
}

export function optionalString(values: OptionValues, name: string): string | undefined {
  const value = values[name];
  return typeof value === 'string' ? value : undefined;
}

export function stringList(values: OptionValues, name: string): string[] {
  const value = values[name];
  if (Array.isArray(value)) return value;
  return typeof value === 'string' ? [value] : [];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The number in `raw`, or a GS_ERR_PARAMETER "--name must be <what>, got 'raw'". */
export function parseNumber(raw: string, name: string, what: string): number {
  const text = raw.trim();
  const value = NUMBER.test(text) ? Number(text) : Number.NaN;
  if (!Number.isFinite(value)) throw parameterError(`--${name} must be ${what}, got '${raw}'`);
  return value;
}

/** A number checked against a predicate; `what` describes the allowed values. */
export function parseChecked(raw: string, name: string, what: string, ok: (value: number) => boolean): number {
  const value = parseNumber(raw, name, what);
  if (!ok(value)) throw parameterError(`--${name} must be ${what}, got '${raw}'`);
  return value;
}

export function parsePositiveMetres(raw: string, name: string): number {
  return parseChecked(raw, name, 'a positive number of metres', (v) => v > 0);
}

/** A size in MB (a positive number, fractions allowed) as bytes, e.g. --body-limit 64. */
export function parseMegabytes(raw: string, name: string): number {
  return Math.round(parseChecked(raw, name, 'a positive number of MB', (v) => v > 0) * 1048576);
}

/** A comma-separated list of positive numbers, e.g. --cells 250,500,1000. */
export function parsePositiveList(raw: string, name: string, what = 'a comma-separated list of positive numbers'): number[] {
  const parts = raw.split(',');
  if (parts.some((part) => part.trim() === '')) throw parameterError(`--${name} must be ${what}, got '${raw}'`);
  return parts.map((part) => parseChecked(part, name, what, (v) => v > 0));
}

/** A whole number >= min, e.g. --placements, --sims, --seed. */
export function parseWholeNumber(raw: string, name: string, min: number): number {
  return parseChecked(raw, name, `a whole number >= ${min}`, (v) => Number.isInteger(v) && v >= min);
}

/** Grid offset "U,V" in cell units, each in [0, 1). */
export function parseOffset(raw: string, name = 'offset'): { u: number; v: number } {
  const what = 'two numbers U,V in cell units, each in [0, 1)';
  const parts = raw.split(',');
  if (parts.length !== 2) throw parameterError(`--${name} must be ${what}, got '${raw}'`);
  const [u, v] = parts.map((part) => {
    const value = NUMBER.test(part.trim()) ? Number(part.trim()) : Number.NaN;
    if (!(value >= 0 && value < 1)) throw parameterError(`--${name} must be ${what}, got '${raw}'`);
    return value;
  });
  return { u, v };
}

/** Grid rotation in degrees, [0, period): the lattice's angle period, 90 for square cells, 60 for hexagons. */
export function parseAngle(raw: string, name = 'angle', period = 90): number {
  return parseChecked(raw, name, `an angle in degrees in [0, ${period})`, (v) => v >= 0 && v < period);
}

/** One cell shape (workers/lattice CELL_SHAPES), e.g. --shape hex. */
export function parseShape(raw: string, name = 'shape'): CellShape {
  const value = raw.trim();
  if (!isCellShape(value)) throw parameterError(`--${name} must be one of ${CELL_SHAPES.join(', ')}, got '${raw}'`);
  return value;
}

/** Significance level of the two-sided test, (0, 0.5]. */
export function parseAlpha(raw: string, name = 'alpha'): number {
  return parseChecked(raw, name, `a significance level in ${PLAN_RANGE_WORDS.alpha}`, (v) => v > 0 && v <= PLAN_LIMITS.alphaMax);
}

/** Least coverage a kept cell must have, (0, 1]. */
export function parseMinCoverage(raw: string, name = 'min-coverage'): number {
  return parseChecked(raw, name, `a share of the cell in ${PLAN_RANGE_WORDS.minCoverage}`, (v) => v > 0 && v <= PLAN_LIMITS.minCoverageMax);
}
