/**
 * Three invented sample designs (one per topology) for the benchmark, the seed data and
 * tests. Compensators were placed with the K factor and snapped to E96/E12; each gives
 * a phase margin of about 55° with fc well below fsw/5 and the RHP zero.
 */
import type { AnalyzeRequest } from './types';

export interface SampleDesign {
  /** Stable key for seed data. */
  key: string;
  name: string;
  request: AnalyzeRequest;
}

export const SAMPLE_DESIGNS: readonly SampleDesign[] = [
  {
    key: 'buck-24v-5v',
    name: '5 V rail from 24 V, ceramic output (buck, 400 kHz, Type III)',
    request: {
      converter: { topology: 'buck', vin: 24, vout: 5, iout: 3, fsw: 400e3, l: 6.8e-6, rl: 0.02, c: 66e-6, rc: 0.003, vd: 0 },
      modulator: { vramp: 1 },
      feedback: { vref: 0.8 },
      compensator: { type: 'type3', r1: 49.9e3, r2: 10.5e3, r3: 1.65e3, c1: 2.2e-9, c2: 68e-12, c3: 470e-12 },
    },
  },
  {
    key: 'boost-3v7-12v',
    name: '12 V from one Li-ion cell, electrolytic output (boost, 600 kHz, Type II)',
    request: {
      converter: { topology: 'boost', vin: 3.7, vout: 12, iout: 0.5, fsw: 600e3, l: 3.3e-6, rl: 0.02, c: 470e-6, rc: 0.08, vd: 0.3 },
      modulator: { vramp: 1 },
      feedback: { vref: 1.25 },
      compensator: { type: 'type2', r1: 10e3, r2: 8.45e3, c1: 10e-9, c2: 270e-12 },
    },
  },
  {
    key: 'buck-boost-12v-n12v',
    name: '−12 V bias rail from 12 V (inverting buck-boost, 300 kHz, Type II)',
    request: {
      converter: { topology: 'buck-boost', vin: 12, vout: 12, iout: 1, fsw: 300e3, l: 10e-6, rl: 0.03, c: 1000e-6, rc: 0.05, vd: 0 },
      modulator: { vramp: 1.5 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', r1: 10e3, r2: 12.1e3, c1: 12e-9, c2: 220e-12 },
    },
  },
];

/**
 * One invented design per control mode and amplifier beyond the samples above: peak current
 * mode with an op-amp and with a transconductance amplifier, a finite op-amp, and a boost at
 * light load (DCM). Read by the benchmark and the control-mode tests.
 */
export const MODE_SAMPLES: readonly SampleDesign[] = [
  {
    key: 'cm-buck-opamp-type2',
    name: 'peak current mode, CCM buck, op-amp Type II',
    request: {
      converter: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
      modulator: { mode: 'peak-current', ri: 0.5, se: 5e4 },
      feedback: { vref: 0.8 },
      compensator: { type: 'type2', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 47e-12 },
    },
  },
  {
    key: 'cm-boost-gm-type2',
    name: 'peak current mode, CCM boost, transconductance Type II',
    request: {
      converter: { topology: 'boost', vin: 5, vout: 12, iout: 0.5, fsw: 400e3, l: 10e-6, rl: 0.03, c: 44e-6, rc: 0.005, vd: 0.4 },
      modulator: { mode: 'peak-current', ri: 0.1, se: 3e4 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 2e6, rb: 40e3 / 9, r1: 40e3, r2: 10e3, c1: 10e-9, c2: 100e-12 },
    },
  },
  {
    key: 'vm-buck-finite-opamp-type3',
    name: 'voltage mode, CCM buck, finite op-amp Type III',
    request: {
      converter: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
      modulator: { vramp: 1 },
      feedback: { vref: 0.8 },
      compensator: { type: 'type3', r1: 10e3, r2: 4.7e3, r3: 500, c1: 10e-9, c2: 220e-12, c3: 4.7e-9, opamp: { a0: 1e5, gbw: 20e6 } },
    },
  },
  {
    key: 'vm-boost-dcm-type2',
    name: 'voltage mode, DCM boost (light load), op-amp Type II',
    request: {
      converter: { topology: 'boost', vin: 5, vout: 12, iout: 0.02, fsw: 400e3, l: 10e-6, rl: 0, c: 44e-6, rc: 0.005, vd: 0.4 },
      modulator: { vramp: 1 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', r1: 10e3, r2: 20e3, c1: 4.7e-9, c2: 47e-12 },
    },
  },
];

/** A sample by key (a throw when the key is not one of ours keeps tests honest). */
export const sampleByKey = (key: string): SampleDesign => {
  const s = [...SAMPLE_DESIGNS, ...MODE_SAMPLES].find((d) => d.key === key);
  if (!s) throw new Error(`no sample design "${key}"`);
  return s;
};
