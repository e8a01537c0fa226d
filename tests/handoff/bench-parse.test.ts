import { describe, expect, it } from 'vitest';
import {
  BENCH_MAX_BYTES,
  BENCH_MAX_ROWS,
  BenchParseError,
  parseBenchData,
  shiftPhase180,
} from '@/lib/handoff/bench-parse';
import { wrapDeg } from '@/lib/engine/transfer';

/** The error a parse throws, or fail. */
function errorOf(input: string | Uint8Array, opts = {}): BenchParseError {
  try {
    parseBenchData(input, opts);
  } catch (e) {
    expect(e).toBeInstanceOf(BenchParseError);
    return e as BenchParseError;
  }
  throw new Error('expected the parse to fail');
}

const rows = (sep: string, data: [number, number, number][], dec = '.') =>
  data.map((r) => r.map((v) => String(v).replace('.', dec)).join(sep)).join('\n');

const SAMPLE: [number, number, number][] = [
  [100, 40.5, -91.2],
  [1000, 20.1, -110.4],
  [10000, -0.5, -125.3],
  [100000, -30.2, -170.8],
];

describe('bench data parser: accepted forms', () => {
  it('reads a comma CSV with a header in Hz', () => {
    const r = parseBenchData('Frequency (Hz),Gain (dB),Phase (deg)\n' + rows(',', SAMPLE));
    expect(r.points.f).toEqual([100, 1000, 10000, 100000]);
    expect(r.points.gainDb).toEqual([40.5, 20.1, -0.5, -30.2]);
    expect(r.points.phaseDeg).toEqual([-91.2, -110.4, -125.3, -170.8]);
    expect(r.separator).toBe('comma');
    expect(r.hasHeader).toBe(true);
    expect(r.frequencyUnit).toBe('Hz');
    expect(r.frequencyUnitSource).toBe('header');
    expect(r.looksInverted).toBe(false);
  });

  it('reads kHz from the header and scales to Hz', () => {
    const r = parseBenchData('Freq [kHz]\tMagnitude [dB]\tPhase [°]\n0.1\t40\t-90\n1\t20\t-100\n10\t0\t-120');
    expect(r.separator).toBe('tab');
    expect(r.frequencyUnit).toBe('kHz');
    expect(r.points.f).toEqual([100, 1000, 10000]);
  });

  it('reads MHz, f/Hz-style and quoted headers', () => {
    expect(parseBenchData('"f/MHz","|T| dB","phi/deg"\n"0.001","10","-95"\n"0.01","-5","-130"').points.f).toEqual([1000, 10000]);
    expect(parseBenchData('f (Hz), gain, phase\n10, 1, -90\n20, 0, -95').points.f).toEqual([10, 20]);
  });

  it('reads semicolons with a decimal comma', () => {
    const r = parseBenchData('Frequenz/Hz;Gain/dB;Phase/deg\n' + rows(';', SAMPLE, ','));
    expect(r.separator).toBe('semicolon');
    expect(r.decimalComma).toBe(true);
    expect(r.points.gainDb).toEqual([40.5, 20.1, -0.5, -30.2]);
  });

  it('reads a file without a header as frequency, gain, phase and says so', () => {
    const r = parseBenchData(rows(',', SAMPLE));
    expect(r.hasHeader).toBe(false);
    expect(r.frequencyUnitSource).toBe('default');
    expect(r.notes.join(' ')).toMatch(/No header/);
  });

  it('takes an explicit kHz unit when the header names none', () => {
    const r = parseBenchData('frequency,gain,phase\n1,10,-90\n2,4,-100', { frequencyUnit: 'kHz' });
    expect(r.points.f).toEqual([1000, 2000]);
    expect(r.frequencyUnitSource).toBe('option');
  });

  it('prefers the header unit over the explicit one and notes it', () => {
    const r = parseBenchData('frequency (Hz),gain,phase\n1,10,-90\n2,4,-100', { frequencyUnit: 'kHz' });
    expect(r.points.f).toEqual([1, 2]);
    expect(r.notes.join(' ')).toMatch(/header says Hz/);
  });

  it('skips instrument metadata, comments, blank lines, CRLF and a BOM', () => {
    const text =
      '\uFEFF# exported by a bench analyzer\r\nDate: 2026-03-04 10:22\r\nPoints: 4, IFBW 100 Hz\r\n\r\n' +
      'Frequency (Hz);Gain (dB);Phase (deg);Group delay (s)\r\n' +
      rows(';', SAMPLE).replace(/\n/g, ';0\r\n') + ';0\r\n';
    const r = parseBenchData(text);
    expect(r.rows).toBe(4);
    expect(r.points.f[3]).toBe(100000);
  });

  it('reads space-separated columns and scientific notation', () => {
    const r = parseBenchData('1e2   40   -90\n1.0E3 20 -100\n1e+4  0  -120');
    expect(r.separator).toBe('space');
    expect(r.points.f).toEqual([100, 1000, 10000]);
  });

  it('reverses a sweep that falls throughout', () => {
    const r = parseBenchData(rows(',', [...SAMPLE].reverse()));
    expect(r.points.f).toEqual([100, 1000, 10000, 100000]);
    expect(r.points.phaseDeg[0]).toBe(-91.2);
    expect(r.notes.join(' ')).toMatch(/reversed/);
  });

  it('converts a phase column labelled in radians', () => {
    const r = parseBenchData('Frequency (Hz),Gain (dB),Phase (rad)\n10,20,-1.5707963267948966\n100,0,-3.141592653589793');
    expect(r.points.phaseDeg[0]).toBeCloseTo(-90, 9);
    expect(r.points.phaseDeg[1]).toBeCloseTo(-180, 9);
  });

  it('reads UTF-16 with a byte-order mark', () => {
    const text = 'Frequency (Hz)\tGain (dB)\tPhase (deg)\n100\t10\t-90\n200\t4\t-95';
    const body = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    expect(parseBenchData(new Uint8Array(body)).points.f).toEqual([100, 200]);
  });
});

describe('bench data parser: phase measured as −T', () => {
  it('flags phase near +90° at low frequency and offers the 180° shift', () => {
    const inverted = SAMPLE.map(([f, g, p]) => [f, g, p + 180] as [number, number, number]);
    const r = parseBenchData('Frequency (Hz),Gain (dB),Phase (deg)\n' + rows(',', inverted));
    expect(r.looksInverted).toBe(true);
    expect(r.lowFrequencyPhaseDeg).toBeGreaterThan(45);
    const shifted = shiftPhase180(r.points);
    expect(shifted.phaseDeg[0]).toBeCloseTo(-91.2, 9);
  });

  it('does not flag a wrapped −T file whose phase reads −270°', () => {
    // −270° is +90° wrapped: also measured as −T.
    const r = parseBenchData('f,gain,phase\n10,40,-270\n100,20,-275\n1000,0,-300');
    expect(r.looksInverted).toBe(true);
    expect(wrapDeg(-270)).toBe(90);
  });

  it('does not flag a normal integrating loop', () => {
    expect(parseBenchData(rows(',', SAMPLE)).looksInverted).toBe(false);
  });
});

describe('bench data parser: rejected files name the line and the problem', () => {
  const header = 'Frequency (Hz),Gain (dB),Phase (deg)\n';

  it('empty', () => {
    expect(errorOf('').message).toBe('the file is empty');
    expect(errorOf('\n \n\t\n').message).toBe('the file is empty');
    expect(errorOf(new Uint8Array()).message).toBe('the file is empty');
  });

  it('a header without data rows', () => {
    expect(errorOf(header).message).toMatch(/no data rows/);
  });

  it('binary: NUL bytes, invalid UTF-8, control characters', () => {
    expect(errorOf(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08])).message).toMatch(/binary/);
    expect(errorOf(new Uint8Array([0x31, 0x2c, 0xc3, 0x28, 0x0a])).message).toMatch(/not UTF-8/);
    expect(errorOf('\x01\x02\x03garbage').message).toMatch(/control characters/);
  });

  it('wrong columns: a header naming other quantities', () => {
    const e = errorOf('Time (s),Voltage (V),Current (A)\n0,1,2\n1,2,3');
    expect(e.line).toBe(1);
    expect(e.message).toMatch(/^line 1: the header names no frequency, gain or phase column/);
  });

  it('wrong columns: a header missing the phase', () => {
    const e = errorOf('Frequency (Hz),Gain (dB)\n100,20\n1000,0');
    expect(e.message).toBe('line 1: the header names no phase (deg) column (found: "Frequency (Hz)", "Gain (dB)"); expected frequency, gain (dB) and phase (deg)');
  });

  it('wrong columns: two columns of numbers, and a short row', () => {
    expect(errorOf('100,20\n1000,0').message).toBe('line 1: 2 columns of numbers; expected 3 (frequency, gain dB, phase deg)');
    expect(errorOf(header + '100,20,-90\n1000,0\n').message).toBe('line 3: 2 columns; expected 3 (frequency, gain dB, phase deg)');
  });

  it('gain not in dB', () => {
    expect(errorOf('Frequency (Hz),Gain (V/V),Phase (deg)\n1,2,3').message).toMatch(/line 1: the gain column "Gain \(V\/V\)" is not in dB/);
  });

  it('NaN, infinity, empty and text fields', () => {
    expect(errorOf(header + '100,20,-90\n1000,NaN,-100').message).toBe('line 3: gain "NaN" is not a number');
    expect(errorOf(header + '100,20,-90\n1000,1,inf').message).toBe('line 3: phase "inf" is not a number');
    expect(errorOf(header + '100,20,-90\n,1,-100').message).toBe('line 3: frequency "" is not a number');
    expect(errorOf(header + '100,20,-90\n1000,1,-100\n2000,abc,-100').message).toBe('line 4: gain "abc" is not a number');
    expect(errorOf(header + '1e999,20,-90\n1000,1,-100').message).toBe('line 2: frequency "1e999" is not a number');
  });

  it('unsorted frequencies', () => {
    const e = errorOf(header + '100,20,-90\n1000,10,-100\n500,5,-110\n2000,0,-120');
    expect(e.line).toBe(4);
    expect(e.message).toBe('line 4: frequency 500 Hz is below 1000 Hz on line 3; the sweep must rise throughout');
  });

  it('a falling sweep that turns back up', () => {
    expect(errorOf(header + '1000,20,-90\n500,10,-100\n800,5,-110').message).toMatch(/^line 4: frequency 800 Hz is above 500 Hz on line 3; the sweep must fall/);
  });

  it('duplicate frequencies, named in the file unit', () => {
    const e = errorOf('Freq (kHz),Gain (dB),Phase (deg)\n1,20,-90\n2.5,10,-100\n2.5,9,-101');
    expect(e.message).toBe('line 4: frequency 2.5 kHz repeats line 3; each frequency may appear once');
  });

  it('a frequency at or below 0', () => {
    expect(errorOf(header + '0,20,-90\n1000,10,-100').message).toBe('line 2: frequency 0 Hz is not above 0');
  });

  it('a single data row', () => {
    expect(errorOf(header + '100,20,-90').message).toMatch(/^line 2: only one data row/);
  });

  it('too many rows', () => {
    const body = Array.from({ length: BENCH_MAX_ROWS + 1 }, (_, k) => `${k + 1},0,-90`).join('\n');
    const e = errorOf(header + body);
    expect(e.tooLarge).toBe(true);
    expect(e.line).toBe(BENCH_MAX_ROWS + 2);
    expect(e.message).toMatch(/more than 20,000 data rows/);
  });

  it('too many bytes', () => {
    const big = new Uint8Array(BENCH_MAX_BYTES + 1).fill(0x20);
    const e = errorOf(big);
    expect(e.tooLarge).toBe(true);
    expect(e.message).toMatch(/limit is 10 MB/);
    expect(errorOf(' '.repeat(BENCH_MAX_BYTES + 1)).tooLarge).toBe(true);
  });

  it('20,000 rows are accepted', () => {
    const body = Array.from({ length: BENCH_MAX_ROWS }, (_, k) => `${k + 1},0,-90`).join('\n');
    expect(parseBenchData(header + body).rows).toBe(BENCH_MAX_ROWS);
  });
});

describe('bench data parser: quoted fields (RFC 4180, read by papaparse)', () => {
  it('reads a quoted header whose names hold the separator', () => {
    const r = parseBenchData('"Frequency, Hz","Gain, dB","Phase, deg"\n' + rows(',', SAMPLE));
    expect(r.hasHeader).toBe(true);
    expect(r.separator).toBe('comma');
    expect(r.frequencyUnit).toBe('Hz');
    expect(r.points.gainDb).toEqual([40.5, 20.1, -0.5, -30.2]);
    expect(r.points.phaseDeg).toEqual([-91.2, -110.4, -125.3, -170.8]);
  });

  it('finds the columns by name when a quoted extra column holds commas and quotes', () => {
    const text =
      'Instrument: "bench analyzer, port 1"\n' +
      '"Point, #",Frequency (kHz),"Gain, dB","Remark ""raw""",Phase (deg)\n' +
      '1,0.1,40,"ok, settled",-90\n2,1,20,"""late""",-100\n3,10,0,,-120\n';
    const r = parseBenchData(text);
    expect(r.points.f).toEqual([100, 1000, 10000]);
    expect(r.points.gainDb).toEqual([40, 20, 0]);
    expect(r.points.phaseDeg).toEqual([-90, -100, -120]);
  });

  it('reads quoted numbers with a decimal comma after a semicolon header', () => {
    const r = parseBenchData('"Frequenz; Hz";"Verstärkung, dB";"Phase, deg"\n"100";"40,5";"-91,2"\n"1000";"20,1";"-110,4"');
    expect(r.separator).toBe('semicolon');
    expect(r.points.gainDb).toEqual([40.5, 20.1]);
  });

  it('reads quoted names in aligned columns', () => {
    const r = parseBenchData('"Freq Hz"   "Gain dB"   "Phase deg"\n100   40   -90\n1000  20  -100');
    expect(r.separator).toBe('space');
    expect(r.points.f).toEqual([100, 1000]);
  });

  it('names the line of a quote left open', () => {
    const e = errorOf('Frequency (Hz),"Gain, dB",Phase (deg)\n100,20,-90\n1000,"10,-100\n2000,0,-120');
    expect(e.line).toBe(3);
    expect(e.message).toBe('line 3: a quoted field is not closed on its line');
  });
});
