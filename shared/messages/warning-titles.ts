/**
 * Plain titles of the input warnings, shown in place of their codes on the page and in the report (the codes stay
 * in the API and in summary.json for programs).
 */
export const WARNING_TITLES: Readonly<Record<string, string>> = Object.freeze({
  'default-study-area': 'No study area given',
  'duplicate-points': 'Points at the same place',
  'points-outside': 'Points outside the valid region',
  projection: 'How the coordinates were projected',
  'skipped-rows': 'Rows left out',
});

/** The title of a warning code; an unknown code becomes a sentence ("some-code" -> "Some code"). */
export function warningTitle(code: string): string {
  const known = WARNING_TITLES[code];
  if (known) return known;
  const words = code.replace(/[-_]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
