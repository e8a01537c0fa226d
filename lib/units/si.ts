/**
 * SI-prefix parsing and formatting for engineering inputs and read-outs.
 *
 * parseSi accepts '4.7u', '4.7µ', '22k', '1n5' (prefix as decimal point: 1.5n), '2M2',
 * '4R7' (R as a decimal point for ohms), '1.5e-9', '100m', '10meg', optional trailing unit
 * ('4.7uH', '22kΩ', '48kHz', '10 ohm'). Returns null on anything else.
 * formatSi(4.7e-6, 'H') gives '4.7 µH' (3 significant digits by default, trailing zeros dropped).
 */

const PREFIX: Record<string, number> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  '\u00b5': -6, // µ micro sign
  '\u03bc': -6, // μ Greek mu
  m: -3,
  R: 0, // '4R7' = 4.7 (ohms)
  k: 3,
  K: 3,
  M: 6,
  meg: 6,
  Meg: 6,
  MEG: 6,
  G: 9,
  T: 12,
};

/** Longest first, so 'meg' wins over 'm'. */
const PREFIX_KEYS = Object.keys(PREFIX).sort((a, b) => b.length - a.length);

/** Units accepted after the number (case matters for single letters: 'F' farad, 'f' femto). */
const UNITS = new Set(['Hz', 'hz', 'HZ', 'H', 'F', '\u03a9', '\u2126', 'ohm', 'Ohm', 'OHM', 'ohms', 'Ohms', 'V', 'A', 's', 'W']);

const NUMBER = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?/;

/**
 * Parse a number with an optional SI prefix and unit; spaces are ignored.
 * @returns the value in SI base units, or null when the text is not such a number.
 */
export const parseSi = (text: string): number | null => {
  if (typeof text !== 'string') return null;
  const s = text.replace(/\s+/g, '');
  const m = NUMBER.exec(s);
  if (!m) return null;
  const [whole, sign, digits, exp] = m;
  const rest = s.slice(whole.length);
  let value = Number(digits) * (exp ? Math.pow(10, Number(exp)) : 1);
  let scale = 0;
  if (rest !== '' && !UNITS.has(rest)) {
    const pre = PREFIX_KEYS.find((p) => rest.startsWith(p));
    if (!pre) return null;
    const tail = /^(\d*)(.*)$/.exec(rest.slice(pre.length));
    if (!tail) return null;
    const [, infix, unit] = tail;
    if (unit !== '' && !UNITS.has(unit)) return null;
    if (infix !== '') {
      // '1n5' style: the prefix stands for the decimal point, only after whole digits.
      if (digits.includes('.') || exp) return null;
      value = Number(`${digits}.${infix}`);
    }
    scale = PREFIX[pre];
  }
  const out = (sign === '-' ? -1 : 1) * value * Math.pow(10, scale);
  return Number.isFinite(out) ? Number(out.toPrecision(15)) : null;
};

const FORMAT_PREFIXES: [number, string][] = [
  [12, 'T'],
  [9, 'G'],
  [6, 'M'],
  [3, 'k'],
  [0, ''],
  [-3, 'm'],
  [-6, 'µ'],
  [-9, 'n'],
  [-12, 'p'],
  [-15, 'f'],
];

/**
 * Format a value with an SI prefix and unit: formatSi(22000, 'Ω') → '22 kΩ',
 * formatSi(1.5e-9, 'F') → '1.5 nF'. `digits` significant digits (default 3), trailing zeros
 * dropped. Non-finite values give '—'.
 */
export const formatSi = (value: number, unit = '', digits = 3): string => {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return `0 ${unit}`.trim();
  const fast = roundedDigits(value, digits);
  const rounded = fast === null ? Number(value.toPrecision(digits)) : 0;
  const exp = fast !== null ? fast[1] : Math.floor(Math.log10(Math.abs(rounded)));
  let k = FORMAT_PREFIXES.length - 1;
  if (exp > 14) k = 0;
  else
    for (let j = 0; j < FORMAT_PREFIXES.length; j++)
      if (exp >= FORMAT_PREFIXES[j][0]) {
        k = j;
        break;
      }
  const [e, prefix] = FORMAT_PREFIXES[k];
  // The digits times one exact power of ten give the same number as parsing
  // (rounded/10^e).toPrecision(digits) back; outside that range, the parse itself.
  const shift = exp - digits + 1 - e;
  const mantissa =
    fast !== null && Math.abs(shift) <= 22
      ? scaleByTen(fast[0], shift)
      : Number(((fast === null ? rounded : Number(value.toPrecision(digits))) / Math.pow(10, e)).toPrecision(digits));
  return `${mantissa} ${prefix}${unit}`.trim();
};

/** x·10^k with the power of ten exact (|k| ≤ 22): one correctly rounded operation. */
const scaleByTen = (x: number, k: number): number => (k >= 0 ? x * Math.pow(10, k) : x / Math.pow(10, -k));

/**
 * value to `digits` significant digits, as toPrecision rounds it, by arithmetic: the integer
 * n of the digits and the decimal exponent of the first (value ≈ n·10^(exp − digits + 1)).
 * toPrecision and the parse back dominated the engine's check messages. Null near a rounding
 * tie, next to a power of ten or out of the exact-power range: formatSi then uses toPrecision.
 */
const roundedDigits = (value: number, digits: number): [number, number] | null => {
  let exp = Math.floor(Math.log10(Math.abs(value)));
  const shift = digits - 1 - exp;
  if (shift > 22 || shift < -22) return null;
  const scaled = Math.abs(scaleByTen(value, shift));
  const top = Math.pow(10, digits);
  if (scaled >= top || scaled < top / 10) return null;
  if (Math.abs(scaled - Math.floor(scaled) - 0.5) < 1e-6) return null;
  let n = Math.round(scaled);
  if (n === top) {
    n /= 10;
    exp += 1;
  }
  return [value < 0 ? -n : n, exp];
};
