/**
 * The domain catalogue: every concept's names, units, bounds and colours in one
 * place. Pure data and small helpers; imports only engine types.
 *
 *   stage-inputs.ts  power-stage inputs (path, label, symbol, unit, bound, help)
 *   compensators.ts  compensator types, their parts, roles, handles and landmarks
 *   margins.ts       margin limits shared by the checks and the readout
 *   signoff.ts       sign-off states and their labels
 *   traces.ts        Bode trace colours
 *   topologies.ts    topology, modulator-mode and amplifier labels
 *   roles.ts         team roles
 *   checks.ts        short labels of the engine's checks
 */
export * from './stage-inputs';
export * from './compensators';
export * from './margins';
export * from './signoff';
export * from './traces';
export * from './topologies';
export * from './modes';
export * from './roles';
export * from './range-inputs';
export * from './checks';
