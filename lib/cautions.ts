/**
 * The safety cautions shown on the Tune screen, the Limits and cautions page
 * and in every exported report. One source so they never drift apart.
 */
export const CAUTIONS: { id: string; title: string; text: string }[] = [
  {
    id: 'hazardous-voltage',
    title: 'Hazardous voltages and stored energy',
    text:
      'Power converters can carry voltages and currents that injure or kill, and capacitors stay charged after power is removed. ' +
      'Work on live hardware only with isolation, suitable probes and instruments, and a second person where your rules require one.',
  },
  {
    id: 'model-limits',
    title: 'Limits of the small-signal model',
    text:
      'Results come from a linearised averaged model in continuous conduction at one operating point. It does not predict large-signal ' +
      'behaviour (start-up, saturation, current limit, slew), discontinuous conduction, parasitics beyond DCR and ESR, op-amp bandwidth and ' +
      'output swing, or effects near half the switching frequency. Margins computed here are estimates.',
  },
  {
    id: 'bench-verification',
    title: 'Verify on the bench',
    text:
      'Measure the loop gain of the built circuit with a network or frequency-response analyzer across line, load and temperature before ' +
      'relying on a design, and check the transient response. Component tolerances and ageing move crossover and margins.',
  },
  {
    id: 'codes-and-practice',
    title: 'Codes and licensed practice',
    text:
      'Follow the safety standards, local electrical codes and approval requirements that apply to your product, and have designs that ' +
      'need it reviewed and signed by a suitably licensed or qualified engineer. Phasewright is a design aid, not a certification.',
  },
];
