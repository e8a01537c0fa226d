/**
 * `npm run bench`: printed timings with their targets, in sections —
 *   engine   median wall time of named engine cases (scripts/bench/engine.ts, bundled as production
 *            compiles it; `--keep-names` compiles as tsx does, for comparison);
 *   list     the designs list's query on 10 / 100 / 10,000 designs, and a design's revisions page on
 *            10 / 100 / 10,000 revisions (scripts/bench/list.ts);
 *   load     autocannon against the production build (scripts/bench/load.ts);
 *   browser  Chromium, cold cache: first drawn loop on Tune, JavaScript per page (scripts/bench/browser.ts).
 * `npm run bench -- --only load` (or engine, list, browser; comma-separated) runs some sections.
 * Not a test: nothing fails on a slow machine.
 */
import os from 'node:os';
import { runEngineBench } from './bench/engine-build';
import { loadSection, printLoad } from './bench/load';
import { browserSection, printBrowser } from './bench/browser';
import { listSection, printList, printRevisions, revisionsSection } from './bench/list';

const SECTIONS = ['engine', 'list', 'load', 'browser'] as const;
type Section = (typeof SECTIONS)[number];

function chosenSections(argv: string[]): Section[] {
  const i = argv.indexOf('--only');
  const raw = i >= 0 ? argv[i + 1] : argv.find((a) => a.startsWith('--only='))?.slice(7);
  if (!raw) return caseFilter(argv) ? ['engine'] : [...SECTIONS];
  const wanted = raw.split(',').map((s) => s.trim());
  const bad = wanted.filter((w) => !SECTIONS.includes(w as Section));
  if (bad.length) throw new Error(`unknown section ${bad.join(', ')}: choose from ${SECTIONS.join(', ')}`);
  return SECTIONS.filter((s) => wanted.includes(s));
}

/** `npm run bench -- spread` runs only the engine cases whose name contains "spread". */
function caseFilter(argv: string[]): string | undefined {
  return argv.find((a, k) => !a.startsWith('--') && argv[k - 1] !== '--only');
}

const main = async () => {
  const sections = chosenSections(process.argv.slice(2));
  const load = os.loadavg()[0];
  console.log(`Phasewright benchmark (${sections.join(', ')}) — node ${process.version}, ${os.cpus().length} cores, load average ${load.toFixed(1)}`);
  if (load > os.cpus().length) console.log('  (the machine is busy: medians include other processes; "best" is closer to the engine alone)');
  const t0 = Date.now();
  if (sections.includes('engine')) await runEngineBench(caseFilter(process.argv.slice(2)), process.argv.includes('--keep-names'));
  if (sections.includes('list')) {
    printList(listSection());
    printRevisions(revisionsSection());
  }
  if (sections.includes('load')) printLoad(await loadSection());
  if (sections.includes('browser')) printBrowser(await browserSection());
  console.log(`\nBench took ${((Date.now() - t0) / 1000).toFixed(0)} s.`);
};

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
