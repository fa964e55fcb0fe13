/**
 * One message source, two phrasings. A message that names an input carries a field reference (`fieldRef`); it is
 * rendered for the page and the HTTP API with the page's field label ("x / longitude column") and for the command
 * line with the flag (--x). So the page never shows command-line syntax and the CLI never shows page labels.
 */

/** The inputs a message can name, with the page's label and the command line's flag. */
export const FIELD_NAMES = {
  points: { label: 'Points', flag: '--points' },
  area: { label: 'Study area', flag: '--area' },
  noData: { label: 'No-data zones', flag: '--no-data' },
  crs: { label: 'Coordinate system', flag: '--crs' },
  x: { label: 'x / longitude column', flag: '--x' },
  y: { label: 'y / latitude column', flag: '--y' },
  id: { label: 'record id column', flag: '--id' },
  skipBadRows: { label: 'Skip rows without coordinates', flag: '--skip-bad-rows' },
  cells: { label: 'Cell sides', flag: '--cells', item: 'cell side' },
  perCell: { label: 'Expected points per cell', flag: '--per-cell', item: 'the cell side for expected points per cell value' },
  cell: { label: 'Cell side', flag: '--cell' },
  placements: { label: 'Placements per cell side', flag: '--placements' },
  design: { label: 'Placement design', flag: '--design' },
  rotation: { label: 'Rotate the grids', flag: '--no-rotation' },
  minCoverage: { label: 'minCoverage', flag: '--min-coverage' },
  alpha: { label: 'alpha', flag: '--alpha' },
  sims: { label: 'CSR simulations', flag: '--sims' },
  seed: { label: 'Seed', flag: '--seed' },
  shape: { label: 'Cell shape', flag: '--shape', item: 'cell shape' },
  bodyLimit: { label: 'the server\'s upload limit', flag: '--body-limit' },
  maxPoints: { label: 'the server\'s point limit', flag: '--max-points' },
} as const;

export type FieldName = keyof typeof FIELD_NAMES;
export type Audience = 'page' | 'cli';

const OPEN = '\uE000';
const CLOSE = '\uE001';
const REFERENCE = /\uE000([A-Za-z]+)(?:#(\d+))?\uE001/g;

/**
 * A reference to an input inside a message, e.g. `${fieldRef('x')} names no column`; `index` (0-based) points at
 * one value of a list field (the second cell side).
 */
export function fieldRef(name: FieldName, index?: number): string {
  return `${OPEN}${name}${index === undefined ? '' : `#${index}`}${CLOSE}`;
}

function ordinal(index: number): string {
  return String(index + 1);
}

const ALTERNATIVE = /\uE002([^\uE002-\uE004]*)\uE003([^\uE002-\uE004]*)\uE004/g;

/**
 * A phrase said two ways, e.g. twoWays('--crs planar', 'the "Coordinate system" choice "planar metres"'): the first
 * on the command line, the second on the page and in the HTTP API.
 */
export function twoWays(cli: string, page: string): string {
  return `\uE002${cli}\uE003${page}\uE004`;
}

/** The message in one audience's words: page labels in quotes, or command-line flags. */
export function renderMessage(text: string, audience: Audience): string {
  return text
    .replace(ALTERNATIVE, (_whole, cli: string, page: string) => (audience === 'cli' ? cli : page))
    .replace(REFERENCE, (_whole, name: string, index: string | undefined) => {
    const entry = FIELD_NAMES[name as FieldName];
    if (!entry) return name;
    const position = index === undefined ? '' : Number(index);
    if (audience === 'cli') return position === '' ? entry.flag : `${entry.flag} value ${ordinal(position)}`;
    if (position === '') return `the "${entry.label}" field`;
    return 'item' in entry ? `${entry.item} ${ordinal(position)}` : `value ${ordinal(position)} of the "${entry.label}" field`;
  });
}

/** The field names a message refers to (for clients that highlight the field at fault). */
export function referencedFields(text: string): FieldName[] {
  return [...text.matchAll(REFERENCE)].map((match) => match[1] as FieldName).filter((name) => name in FIELD_NAMES);
}
