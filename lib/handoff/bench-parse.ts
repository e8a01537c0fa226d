/**
 * Bench data parser: the loop gain T measured with a network or frequency-response analyzer,
 * exported as CSV or TSV of frequency, gain (dB) and phase (degrees).
 *
 * Accepted:
 * - separators comma, semicolon, tab, or runs of spaces; fields may be quoted (`"Gain, dB"`,
 *   RFC 4180 quoting, read by papaparse); with a semicolon, tab or space separator a decimal
 *   comma is read as a decimal point (`1,5` → 1.5);
 * - an optional header line naming the columns in any common wording ("Frequency (Hz)",
 *   "Freq [kHz]", "f/Hz", "Gain dB", "Magnitude (dB)", "Phase (deg)", "Phase/°"), with extra
 *   columns ignored; lines of text above the header (instrument metadata) are skipped;
 *   without a header the first three columns are taken as frequency, gain, phase;
 * - frequency in Hz, kHz or MHz, read from the header's unit or given explicitly; phase in
 *   degrees (radians are converted when the header says so);
 * - a sweep that rises or one that falls throughout (the latter is reversed).
 *
 * Rejected with a message naming the line: an empty or binary file, more than
 * {@link BENCH_MAX_BYTES} bytes or {@link BENCH_MAX_ROWS} rows, missing or misnamed columns,
 * a field that is not a finite number, a frequency that is not above 0, repeats or breaks
 * the order of the sweep.
 *
 * Phase convention: the phase of T, near −90° at low frequency for an integrating
 * compensator. A file whose phase sits near +90° there was measured as −T (the analyzer's
 * channels swapped or the injection inverted); the result says so, and the caller may
 * store a 180° shift.
 */

import Papa from 'papaparse';
import { formatCount } from '@/lib/format';
import { wrapDeg } from '@/lib/engine/transfer';

export const BENCH_MAX_BYTES = 10 * 1024 * 1024;
export const BENCH_MAX_ROWS = 20_000;

export type FrequencyUnit = 'Hz' | 'kHz' | 'MHz';
const UNIT_SCALE: Record<FrequencyUnit, number> = { Hz: 1, kHz: 1e3, MHz: 1e6 };

export interface BenchPoints {
  /** Hz, strictly rising. */
  f: number[];
  gainDb: number[];
  phaseDeg: number[];
}

export interface BenchParseOptions {
  /** Unit of the frequency column when the header does not name one (default Hz). */
  frequencyUnit?: FrequencyUnit;
}

export interface BenchParseResult {
  points: BenchPoints;
  rows: number;
  separator: 'comma' | 'semicolon' | 'tab' | 'space';
  decimalComma: boolean;
  frequencyUnit: FrequencyUnit;
  /** Where the unit came from: the header, the caller, or the Hz default. */
  frequencyUnitSource: 'header' | 'option' | 'default';
  hasHeader: boolean;
  /** Plain-language remarks on what was assumed or converted. */
  notes: string[];
  /** Phase near +90° at low frequency: probably measured as −T. */
  looksInverted: boolean;
  /** Median phase of the lowest-frequency points, degrees wrapped to (−180, 180]. */
  lowFrequencyPhaseDeg: number;
}

/** A file that cannot be read; `line` is 1-based, or null for the file as a whole. */
export class BenchParseError extends Error {
  constructor(
    readonly line: number | null,
    readonly problem: string,
    readonly tooLarge = false,
  ) {
    super(line === null ? problem : `line ${line}: ${problem}`);
    this.name = 'BenchParseError';
  }
}

type Separator = BenchParseResult['separator'];
const SEP_CHAR: Record<Exclude<Separator, 'space'>, string> = { comma: ',', semicolon: ';', tab: '\t' };

/** Bytes to text: UTF-8 (BOM optional) or UTF-16 with a BOM; a NUL byte or bad UTF-8 means binary. */
export function decodeBenchBytes(bytes: Uint8Array): string {
  if (bytes.length > BENCH_MAX_BYTES) throw tooLarge(bytes.length);
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  if (bytes.includes(0)) throw new BenchParseError(null, 'the file is binary, not text; export the measurement as CSV or TSV');
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    throw new BenchParseError(null, 'the file is not UTF-8 text (it looks binary); export the measurement as CSV or TSV');
  }
}

const tooLarge = (bytes: number) =>
  new BenchParseError(
    null,
    `the file is ${(bytes / 1024 / 1024).toFixed(1)} MB; the limit is ${BENCH_MAX_BYTES / 1024 / 1024} MB`,
    true,
  );

const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const unquoteSingle = (s: string) => s.trim().replace(/^'(.*)'$/, '$1').trim();

/**
 * Lines to fields. Delimited lines go through one papaparse call (RFC 4180 quoting: a separator
 * inside quotes is text, `""` is a quote); aligned columns split on runs of spaces, a quoted
 * field keeping its spaces. A quote left open names its line.
 */
function splitRows(lines: readonly string[], lineNos: readonly number[], sep: Separator): string[][] {
  if (sep === 'space')
    return lines.map((line) => Array.from(line.trim().matchAll(/"([^"]*)"|(\S+)/g), (m) => unquoteSingle(m[1] ?? m[2])));
  const parsed = Papa.parse<string[]>(lines.join('\n'), { delimiter: SEP_CHAR[sep], newline: '\n', quoteChar: '"', skipEmptyLines: false });
  const open = parsed.errors.find((e) => e.type === 'Quotes');
  if (open || parsed.data.length !== lines.length) {
    const row = open?.row ?? parsed.data.findIndex((fields) => fields.some((x) => x.includes('\n')));
    throw new BenchParseError(lineNos[Math.max(0, row ?? 0)] ?? null, 'a quoted field is not closed on its line');
  }
  return parsed.data.map((fields) => fields.map(unquoteSingle));
}

/** The separator of one line, read outside quoted fields. */
function detectSeparator(line: string): Separator {
  const bare = line.replace(/"[^"]*"/g, '""');
  if (bare.includes('\t')) return 'tab';
  if (bare.includes(';')) return 'semicolon';
  if (bare.includes(',')) return 'comma';
  return 'space';
}

function parseNumber(field: string, decimalComma: boolean): number | null {
  let s = field.replace(/\s+/g, '');
  if (decimalComma) s = s.replace(',', '.');
  if (!NUMBER_RE.test(s)) return null;
  const v = Number(s);
  return Number.isFinite(v) ? v : null;
}

interface ColumnMap {
  f: number;
  gain: number;
  phase: number;
  unit: FrequencyUnit | null;
  phaseInRadians: boolean;
}

const norm = (h: string) => h.toLowerCase().replace(/\s+/g, ' ').trim();

function frequencyUnitOf(h: string): FrequencyUnit | null {
  if (/\bmhz\b/.test(h)) return 'MHz';
  if (/\bkhz\b/.test(h)) return 'kHz';
  if (/\bhz\b/.test(h)) return 'Hz';
  return null;
}

const isFrequency = (h: string) => /^(f|freq|frequency)\b|\bfreq|\bhz\b|^f\s*[([/]/.test(h);
const isPhase = (h: string) => /phase|^phi\b|^φ|°|\bdeg|\bdegrees?\b|^∠/.test(h);
const isGain = (h: string) => /gain|mag|amplitude|^\|?t\|?\b|\bdb\b|^level\b/.test(h);

/** Columns named by a header line, or null when the line is not a header of ours. */
function mapHeader(fields: string[]): ColumnMap | { error: string } | null {
  const hs = fields.map(norm);
  const f = hs.findIndex(isFrequency);
  const phase = hs.findIndex((h, i) => i !== f && isPhase(h));
  const gain = hs.findIndex((h, i) => i !== f && i !== phase && isGain(h));
  const named = [f, gain, phase].filter((i) => i >= 0).length;
  if (named === 0) return null;
  if (named < 3) {
    const missing = [f < 0 && 'frequency', gain < 0 && 'gain (dB)', phase < 0 && 'phase (deg)'].filter(Boolean).join(' and ');
    return { error: `the header names no ${missing} column (found: ${fields.map((x) => `"${x}"`).join(', ')}); expected frequency, gain (dB) and phase (deg)` };
  }
  const g = hs[gain];
  if (/\b(v\/v|lin|linear|abs|ratio)\b/.test(g) && !/\bdb\b/.test(g))
    return { error: `the gain column "${fields[gain]}" is not in dB; export the gain in dB` };
  return {
    f,
    gain,
    phase,
    unit: frequencyUnitOf(hs[f]),
    phaseInRadians: /\brad\b|radians?/.test(hs[phase]) && !/deg|°/.test(hs[phase]),
  };
}

/**
 * Parse bench data from text (or bytes, decoded with {@link decodeBenchBytes}).
 * @throws BenchParseError naming the line and the problem.
 */
export function parseBenchData(input: string | Uint8Array, opts: BenchParseOptions = {}): BenchParseResult {
  if (typeof input !== 'string') input = decodeBenchBytes(input);
  else if (Buffer.byteLength(input, 'utf8') > BENCH_MAX_BYTES) throw tooLarge(Buffer.byteLength(input, 'utf8'));
  const text = input.replace(/^\uFEFF/, '');
  if (text.trim() === '') throw new BenchParseError(null, 'the file is empty');
  // eslint-disable-next-line no-control-regex
  if (/[\x00-\x08\x0e-\x1f]/.test(text.slice(0, 4096)))
    throw new BenchParseError(null, 'the file holds control characters (it looks binary); export the measurement as CSV or TSV');

  const lines = text.split(/\r\n|\n|\r/);
  const notes: string[] = [];
  let sep: Separator | null = null;
  let decimalComma = false;
  let columns: ColumnMap | null = null;
  let hasHeader = false;
  const f: number[] = [];
  const gainDb: number[] = [];
  const phaseDeg: number[] = [];
  const lineOf: number[] = [];
  const bodyLines: string[] = [];
  const bodyLineNos: number[] = [];
  let previousText: { lineNo: number; fields: string[]; headerError?: string } | null = null;
  let contentLine = 0;

  for (let i = 0; i < lines.length; i++) {
    const lineNo = i + 1;
    const line = lines[i];
    const trimmed = line.trim();
    if (trimmed === '' || /^(#|\/\/|!|\*)/.test(trimmed)) continue;
    const lastContentLine = contentLine;
    contentLine = lineNo;

    if (columns === null) {
      const s = detectSeparator(trimmed);
      let fields: string[];
      try {
        [fields] = splitRows([trimmed], [lineNo], s);
      } catch {
        previousText = { lineNo, fields: [trimmed] }; // an open quote above the header: metadata text
        continue;
      }
      const dc = s !== 'comma';
      const numeric = fields.filter((x) => parseNumber(x, dc) !== null).length;
      if (numeric === fields.length) {
        // A text line just above the numbers is a header naming too few or other columns.
        if (previousText?.headerError && previousText.lineNo === lastContentLine)
          throw new BenchParseError(previousText.lineNo, previousText.headerError);
        if (previousText && previousText.lineNo === lastContentLine && previousText.fields.length === fields.length && fields.length > 1)
          throw new BenchParseError(
            previousText.lineNo,
            `the header names no frequency, gain or phase column (found: ${previousText.fields.map((x) => `"${x}"`).join(', ')}); expected frequency, gain (dB) and phase (deg)`,
          );
        // First data line without a header of ours: the first three columns, in order.
        if (fields.length < 3)
          throw new BenchParseError(lineNo, `${fields.length} column${fields.length === 1 ? '' : 's'} of numbers; expected 3 (frequency, gain dB, phase deg)`);
        sep = s;
        decimalComma = dc;
        columns = { f: 0, gain: 1, phase: 2, unit: null, phaseInRadians: false };
        notes.push('No header line: the columns were read as frequency, gain (dB), phase (deg).');
        if (fields.length > 3) notes.push(`Columns after the third were ignored (${fields.length} found).`);
      } else {
        const header = mapHeader(fields);
        if (header && 'error' in header) {
          // Only fatal when the numbers follow at once; otherwise it was metadata.
          previousText = { lineNo, fields, headerError: header.error };
          continue;
        }
        if (header) {
          sep = s;
          decimalComma = dc;
          columns = header;
          hasHeader = true;
          continue;
        }
        previousText = { lineNo, fields };
        continue; // text above the header: instrument metadata
      }
    }

    bodyLines.push(trimmed);
    bodyLineNos.push(lineNo);
    if (bodyLines.length > BENCH_MAX_ROWS)
      throw new BenchParseError(lineNo, `more than ${formatCount(BENCH_MAX_ROWS)} data rows; thin the sweep`, true);
  }

  if (columns !== null && bodyLines.length > 0) {
    const rowsOfFields = splitRows(bodyLines, bodyLineNos, sep!);
    const need = Math.max(columns.f, columns.gain, columns.phase) + 1;
    for (let k = 0; k < rowsOfFields.length; k++) {
      const fields = rowsOfFields[k];
      const lineNo = bodyLineNos[k];
      if (fields.length < need)
        throw new BenchParseError(lineNo, `${fields.length} column${fields.length === 1 ? '' : 's'}; expected ${need} (frequency, gain dB, phase deg)`);
      const read = (idx: number, what: string) => {
        const v = parseNumber(fields[idx], decimalComma);
        if (v === null) throw new BenchParseError(lineNo, `${what} "${fields[idx].slice(0, 30)}" is not a number`);
        return v;
      };
      f.push(read(columns.f, 'frequency'));
      gainDb.push(read(columns.gain, 'gain'));
      phaseDeg.push(read(columns.phase, 'phase'));
      lineOf.push(lineNo);
    }
  }

  if (columns === null) throw new BenchParseError(null, 'no header naming frequency, gain and phase, and no rows of numbers');
  if (f.length === 0) throw new BenchParseError(null, 'the header is there but no data rows follow it');
  if (f.length < 2) throw new BenchParseError(lineOf[0], 'only one data row; a sweep needs at least two frequencies');

  const unit = columns.unit ?? opts.frequencyUnit ?? 'Hz';
  const frequencyUnitSource = columns.unit ? 'header' : opts.frequencyUnit ? 'option' : 'default';
  if (frequencyUnitSource === 'default') notes.push('The frequency column names no unit: read as Hz.');
  if (columns.unit && opts.frequencyUnit && columns.unit !== opts.frequencyUnit)
    notes.push(`The header says ${columns.unit}; that was used rather than the ${opts.frequencyUnit} chosen.`);
  const scale = UNIT_SCALE[unit];
  for (let k = 0; k < f.length; k++) {
    if (f[k] <= 0) throw new BenchParseError(lineOf[k], `frequency ${f[k]} ${unit} is not above 0`);
    f[k] *= scale;
  }
  if (columns.phaseInRadians) {
    for (let k = 0; k < phaseDeg.length; k++) phaseDeg[k] *= 180 / Math.PI;
    notes.push('The phase column was in radians: converted to degrees.');
  }

  checkOrder(f, lineOf, unit, scale, notes, gainDb, phaseDeg);

  const { looksInverted, lowFrequencyPhaseDeg: low } = inspectLowFrequencyPhase(phaseDeg);
  return {
    points: { f, gainDb, phaseDeg },
    rows: f.length,
    separator: sep!,
    decimalComma: decimalComma && /\d,\d/.test(text),
    frequencyUnit: unit,
    frequencyUnitSource,
    hasHeader,
    notes,
    looksInverted,
    lowFrequencyPhaseDeg: low,
  };
}

/** Rising or falling throughout; a falling sweep is reversed in place. */
function checkOrder(
  f: number[],
  lineOf: number[],
  unit: FrequencyUnit,
  scale: number,
  notes: string[],
  gainDb: number[],
  phaseDeg: number[],
) {
  const show = (hz: number) => `${+(hz / scale).toPrecision(10)} ${unit}`;
  const falling = f[1] < f[0];
  for (let k = 1; k < f.length; k++) {
    if (f[k] === f[k - 1])
      throw new BenchParseError(lineOf[k], `frequency ${show(f[k])} repeats line ${lineOf[k - 1]}; each frequency may appear once`);
    if (falling ? f[k] > f[k - 1] : f[k] < f[k - 1])
      throw new BenchParseError(
        lineOf[k],
        `frequency ${show(f[k])} is ${falling ? 'above' : 'below'} ${show(f[k - 1])} on line ${lineOf[k - 1]}; the sweep must ${falling ? 'fall' : 'rise'} throughout`,
      );
  }
  if (falling) {
    f.reverse();
    gainDb.reverse();
    phaseDeg.reverse();
    lineOf.reverse();
    notes.push('The sweep fell in frequency: the rows were reversed.');
  }
}

/** Median wrapped phase of the lowest-frequency points (the first 5 %, at least 3). */
function lowFrequencyPhase(phaseDeg: number[]): number {
  const n = Math.min(phaseDeg.length, Math.max(3, Math.ceil(phaseDeg.length * 0.05)));
  const w = phaseDeg
    .slice(0, n)
    .map(wrapDeg)
    .sort((a, b) => a - b);
  return w.length % 2 ? w[(w.length - 1) / 2] : (w[w.length / 2 - 1] + w[w.length / 2]) / 2;
}

/** Whether a phase sweep (rising f) sits near +90° at its low end, i.e. was measured as −T. */
export function inspectLowFrequencyPhase(phaseDeg: number[]): { looksInverted: boolean; lowFrequencyPhaseDeg: number } {
  const low = lowFrequencyPhase(phaseDeg);
  return { looksInverted: low > 45 && low < 135, lowFrequencyPhaseDeg: low };
}

/** The 180° shift offered for data measured as −T: phase − 180°, kept near the original branch. */
export function shiftPhase180(points: BenchPoints): BenchPoints {
  return { ...points, phaseDeg: points.phaseDeg.map((p) => p - 180) };
}
