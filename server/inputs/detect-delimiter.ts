/**
 * Field delimiter of a CSV file, detected from its header line among comma, semicolon, tab and vertical bar:
 * the candidate occurring most often outside double quotes (ties broken in that order; comma when none occurs).
 * Cost O(length of the first line).
 */
const CANDIDATES = [',', ';', '\t', '|'] as const;

export function detectDelimiter(text: string): string {
  const counts = new Map<string, number>(CANDIDATES.map((c) => [c, 0]));
  let quoted = false;
  for (let k = 0; k < text.length; k += 1) {
    const ch = text[k];
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) break;
    else if (!quoted && counts.has(ch)) counts.set(ch, (counts.get(ch) ?? 0) + 1);
  }
  let best: string = ',';
  let bestCount = 0;
  for (const candidate of CANDIDATES) {
    const count = counts.get(candidate) ?? 0;
    if (count > bestCount) {
      best = candidate;
      bestCount = count;
    }
  }
  return best;
}
