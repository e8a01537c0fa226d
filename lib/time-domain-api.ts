import { z } from 'zod';
import { roundSignificant } from '@/lib/engine/precision';
import type { Waveform } from '@/lib/engine/switching-check';

/** Any JSON object; the time-domain parsers check the fields and name them. */
export const anyJsonObject = z.looseObject({});

/** Arrays in answers carry 6 significant digits, like the Bode arrays. */
export const roundAll = (a: number[]): number[] => a.map((x) => roundSignificant(x));

export const roundWaveform = (w: Waveform): Waveform => ({ t: roundAll(w.t), vout: roundAll(w.vout), iL: roundAll(w.iL) });
