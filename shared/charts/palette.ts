/**
 * Colours of the page and the report: the Okabe-Ito palette, which stays distinguishable for the common forms of
 * colour-vision deficiency (Okabe M., Ito K., 2008, "Color Universal Design (CUD): how to make figures and
 * presentations that are friendly to colorblind people", J*Fly), plus a viridis-like sequential ramp for counts
 * and heat maps (van der Walt S., Smith N., 2015, "A better default colormap for Matplotlib", SciPy 2015).
 */
export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

export const NEUTRAL = {
  grey: '#7a7a7a',
  lightGrey: '#d9d9d9',
  ink: '#1f2328',
  paper: '#ffffff',
} as const;

/** Colour of each verdict: clustered vermillion, CSR grey, regular blue. */
export const VERDICT_COLOURS = {
  clustered: OKABE_ITO.vermillion,
  csr: NEUTRAL.grey,
  regular: OKABE_ITO.blue,
} as const;

/** Five anchor colours of the viridis ramp, from low to high. */
const SEQUENTIAL_STOPS: ReadonlyArray<readonly [number, number, number]> = [
  [68, 1, 84],
  [59, 82, 139],
  [33, 145, 140],
  [94, 201, 98],
  [253, 231, 37],
];

/** '#rrggbb' with an alpha in [0, 1] as an rgba() string. */
export function withAlpha(hex: string, alpha: number): string {
  const value = Number.parseInt(hex.slice(1), 16);
  const red = (value >> 16) & 255;
  const green = (value >> 8) & 255;
  const blue = value & 255;
  return `rgba(${red}, ${green}, ${blue}, ${alpha})`;
}

function toHex(channel: number): string {
  return Math.round(channel).toString(16).padStart(2, '0');
}

/**
 * Sequential colour for t in [0, 1] (clamped), by linear interpolation between the viridis anchors in RGB.
 * Non-finite t gives the light grey used for "no value".
 */
export function sequentialColour(t: number): string {
  if (!Number.isFinite(t)) return NEUTRAL.lightGrey;
  const clamped = Math.min(1, Math.max(0, t));
  const scaled = clamped * (SEQUENTIAL_STOPS.length - 1);
  const lower = Math.min(SEQUENTIAL_STOPS.length - 2, Math.floor(scaled));
  const fraction = scaled - lower;
  const from = SEQUENTIAL_STOPS[lower];
  const to = SEQUENTIAL_STOPS[lower + 1];
  const mix = (k: number) => from[k] + (to[k] - from[k]) * fraction;
  return `#${toHex(mix(0))}${toHex(mix(1))}${toHex(mix(2))}`;
}

/** The ramp's anchors as a CSS linear-gradient, for legends drawn in HTML. */
export function sequentialGradientCss(): string {
  const stops = SEQUENTIAL_STOPS.map((_, k) => sequentialColour(k / (SEQUENTIAL_STOPS.length - 1)));
  return `linear-gradient(to right, ${stops.join(', ')})`;
}
