import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** Debian's ngspice; NGSPICE_PATH points elsewhere (e.g. at a missing file to try the skip/fail rule). */
export const NGSPICE = process.env.NGSPICE_PATH ?? '/usr/bin/ngspice';

/**
 * Whether ngspice can be used. Missing on a developer's machine: the tests say they were
 * skipped. Missing under CI=true: that is a failure.
 */
export function ngspiceAvailable(): boolean {
  if (fs.existsSync(NGSPICE)) return true;
  if (process.env.CI === 'true') throw new Error(`ngspice is required in CI but ${NGSPICE} is missing (apt-get install ngspice)`);
  console.warn(`[skipped] ngspice tests: ${NGSPICE} not found (apt-get install ngspice)`);
  return false;
}

/** Run a netlist file as it is with `ngspice -b`; returns stdout (throws with the output on failure). */
export function runNgspice(netlist: string, fileName = 'circuit.cir'): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-spice-'));
  try {
    const file = path.join(dir, fileName);
    fs.writeFileSync(file, netlist);
    const r = spawnSync(NGSPICE, ['-b', file], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
    if (r.status !== 0 || /\berror\b/i.test(r.stderr ?? '')) throw new Error(`ngspice failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
    return r.stdout;
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Rows of the last `print` table whose header names `columns` (after Index), e.g.
 * ['frequency', 'loopdb', 'loopdeg'] → number[][] in that order.
 */
export function readNgspiceTable(stdout: string, columns: string[]): number[][] {
  const lines = stdout.split(/\r?\n/);
  const rows: number[][] = [];
  let take = false;
  for (const line of lines) {
    const fields = line.trim().split(/\s+/);
    if (fields[0] === 'Index') {
      take = columns.every((c, i) => fields[i + 1]?.toLowerCase() === c.toLowerCase());
      continue;
    }
    if (!take || !/^\d+$/.test(fields[0])) continue;
    rows.push(fields.slice(1, columns.length + 1).map(Number));
  }
  return rows;
}

/** A scalar printed by `print name` (e.g. 'v(duty)' from "v(duty) = 4.1e-01"); NaN when absent. */
export function readNgspiceValue(stdout: string, name: string): number {
  const escaped = name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const m = new RegExp(`^\\s*${escaped}\\s*=\\s*(\\S+)`, 'im').exec(stdout);
  return m ? Number(m[1]) : NaN;
}
