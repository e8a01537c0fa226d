/**
 * The demo's review story: designs that show all three jobs — the designer's (revisions and
 * bench data), the reviewer's (remarks, decisions, a design waiting for them) and the hand-off
 * (an approved revision with bench data on its model). Each story is data: a sample from the
 * engine, then revisions with the compensator changes, bench runs, the review and remarks.
 * Adding a design (another control mode, an operating range) is adding an entry.
 *
 * Everything a story does goes through the same query functions as the app, and the mail it
 * would have sent is stored in the demo mailbox (rendered as the app renders its mail).
 */
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { RangeFields } from '@/lib/engine/range';
import type { AnalyzeRequest, CompensatorInput, ModulatorInput } from '@/lib/engine/types';
import { renderMail } from '@/lib/mail-render';
import { summarizeRange, worstCaseSentence } from '@/lib/range-summary';
import { summarizeAnalysis } from '@/lib/revision-summary';
import type { Db } from './connection';
import { addRemark, createBenchData, createDesign, createRevision, decideSignoff, storeMail, submitForReview } from './queries';

type Who = 'designer' | 'reviewer' | 'admin';

export interface DemoBenchRun {
  name: string;
  /** The measured loop differs from the model by this much (a board is never the model). */
  gainOffsetDb: number;
  phaseOffsetDeg: number;
}

export interface DemoRevision {
  note: string;
  /** Changes to the sample's compensator for this revision. */
  compensator?: Partial<CompensatorInput>;
  /** The modulator of this revision (e.g. more slope compensation), when it changes. */
  modulator?: ModulatorInput;
  bench?: DemoBenchRun[];
  review?: {
    /** The designer submits to the demo reviewer with this message. */
    submit: string;
    /** Remarks after submitting; comparedWith: written on Compare against that revision. */
    remarks?: { by: Who; body: string; comparedWith?: number }[];
    decision?: { decision: 'approve' | 'request-changes'; message: string };
  };
}

export interface DemoStory {
  /** An engine sample by key, or the story's own stage (with its operating range and step). */
  sample: string | (AnalyzeRequest & RangeFields);
  name: string;
  description: string;
  revisions: DemoRevision[];
}

const sampleRequest = (key: string): AnalyzeRequest => {
  const sample = SAMPLE_DESIGNS.find((s) => s.key === key);
  if (!sample) throw new Error(`engine sample ${key} is missing`);
  return sample.request;
};

export const DEMO_STORIES: DemoStory[] = [
  {
    sample: {
      ...sampleRequest('boost-3v7-12v'),
      // The camera and its lamp never draw less than half load; a polymer-hybrid electrolytic,
      // whose ESR moves far less with temperature than a wet one's.
      range: { vin: { min: 3.3, max: 4.1 }, iout: { min: 0.25, max: 0.5 }, l: { tol: 0.2 }, c: { tol: 0.2 }, rc: { min: 0.07, max: 0.12 } },
      targets: { phaseMarginDeg: 45, gainMarginDb: 10 },
    },
    name: '12 V camera supply — wrist gripper',
    description: 'One Li-ion cell to 12 V / 0.5 A at 600 kHz; feeds the wrist camera and its IR lamp',
    revisions: [
      {
        note: 'First try: zero placed high for a fast transient',
        compensator: { c1: 2.2e-9, r2: 8450 },
        bench: [{ name: 'Bring-up board A, 3.7 V in, 0.5 A', gainOffsetDb: -0.6, phaseOffsetDeg: -4 }],
        review: {
          submit: 'First pass for the camera rail; the lamp switches 0.3 A steps, please look at PM.',
          remarks: [
            { by: 'reviewer', body: 'PM is 31° at full load and the bring-up board measures less. The lamp steps will ring.' },
            { by: 'designer', body: 'Agreed; I will move the zero down and keep fc near 12 kHz.' },
          ],
          decision: { decision: 'request-changes', message: 'Bring PM to at least 45° at 0.5 A before the pilot build.' },
        },
      },
      {
        note: 'Zero lower, gain up for more crossover',
        compensator: { c1: 4.7e-9, r2: 16900 },
        review: {
          submit: 'Zero moved down; I also raised the gain to get fc to 20 kHz.',
          remarks: [
            {
              by: 'reviewer',
              comparedWith: 1,
              body: 'Compared with r1: fc went from 13 to 20 kHz but PM is still under 40°. The RHP zero at 102 kHz leaves no room for that crossover.',
            },
          ],
          decision: { decision: 'request-changes', message: 'Keep fc near 12 kHz (well under a third of the RHP zero) and use the zero for phase.' },
        },
      },
      {
        note: 'fc back to 12 kHz, zero low (280 Hz) so the low-ESR corners keep their phase: PM 69°, worst corner 51°',
        compensator: { r2: 8450, c1: 68e-9, c2: 100e-12 },
        bench: [{ name: 'Pilot board 1, 3.7 V in, 0.5 A', gainOffsetDb: -0.8, phaseOffsetDeg: -2.5 }],
        review: {
          submit: 'fc 12 kHz, PM 69°, GM 19 dB; worst corner 51° (high line, light load, ESR low). The pilot board is measured and attached.',
          remarks: [{ by: 'reviewer', comparedWith: 2, body: 'The bench data sits within 1 dB and 3° of the model up to 100 kHz. Good.' }],
          decision: { decision: 'approve', message: 'Approved for the pilot build.' },
        },
      },
    ],
  },
  {
    sample: {
      converter: { topology: 'boost', vin: 5, vout: 12, iout: 1, fsw: 400e3, l: 6.8e-6, rl: 0.025, c: 44e-6, rc: 0.004, vd: 0.35 },
      modulator: { mode: 'peak-current', ri: 0.1, se: 2e4 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 10e6, rb: 11e3, r1: 100e3, r2: 4.53e3, c1: 22e-9, c2: 1.5e-9 },
      parts: { resistorSeries: 'E96', capacitorSeries: 'E12' },
      // A USB-C 5 V input that sags under cable drop; two 22 µF ceramics lose capacitance with bias.
      range: { vin: { min: 4.5, max: 5.5 }, iout: { min: 0.1, max: 1 }, l: { tol: 0.2 }, c: { tol: 0.3 }, rc: { min: 0.002, max: 0.008 } },
      targets: { phaseMarginDeg: 45, gainMarginDb: 10 },
      step: { kind: 'load', from: 0.5, to: 1, slew: 1e6, band: 0.01 },
    },
    name: '12 V solenoid bus — parcel sorter gate',
    description: '5 V (USB-C) to 12 V / 1 A at 400 kHz, peak current mode, transconductance amplifier; the gate solenoid pulls 0.5 A steps',
    revisions: [
      {
        note: 'First pass: slope compensation at the controller’s smallest setting (20 kV/s)',
        review: {
          submit: 'Current-mode boost for the sorter gate; nominal PM 61°. Please look at the low-line corners.',
          remarks: [
            {
              by: 'reviewer',
              body: 'At 4.5 V in the duty reaches 0.64 and mc·D′ drops under 0.5: the corner table flags subharmonic risk at every low-line, full-load corner. Nominal Qp is already 33.',
            },
          ],
          decision: { decision: 'request-changes', message: 'Raise the external ramp so the current loop is stable at the lowest line, then resubmit with the corners clear.' },
        },
      },
      {
        note: 'External ramp 82 kV/s: every corner clear, worst PM 46° at low line, light load',
        modulator: { mode: 'peak-current', ri: 0.1, se: 8.2e4 },
        bench: [{ name: 'Gate board EVT-2, 5.0 V in, 1 A', gainOffsetDb: 0.5, phaseOffsetDeg: -3 }],
        review: {
          submit: 'Se raised to 82 kV/s (one resistor on the slope pin). No corner at risk now; the EVT board is measured and attached.',
          remarks: [{ by: 'reviewer', comparedWith: 1, body: 'Compared with r1: the subharmonic corners are gone, worst PM 46° still meets the target. The 0.5 A step settles in well under a millisecond.' }],
          decision: { decision: 'approve', message: 'Approved for EVT-3.' },
        },
      },
    ],
  },
];

/** A design waiting for the demo reviewer: the second revision of this design, submitted. */
export const DEMO_WAITING = {
  name: '5 V logic rail — arm controller',
  revision: { note: 'Integrator up 10 % for a faster load step', r1Scale: 0.9 } as const,
  message: 'A little more gain for the 2 A step of the arm motors; PM stays above 50°.',
};

const LABELS = { designer: 'Dara Designer', reviewer: 'Rui Reviewer', admin: 'Ada Admin' } as const;

/** A measured loop made from the model: offsets plus a small, repeatable ripple (no randomness). */
function benchPointsFor(request: AnalyzeRequest, run: DemoBenchRun) {
  const fStop = request.converter.fsw / 2;
  const m = analyze({ ...request, sweep: { fStart: 50, fStop, points: 90 } }).bode;
  return {
    f: m.f,
    gainDb: m.loop.magDb.map((y, i) => y + run.gainOffsetDb + 0.15 * Math.sin(i * 1.7)),
    phaseDeg: m.loop.phaseDeg.map((y, i) => y + run.phaseOffsetDeg + 0.6 * Math.sin(i * 2.3)),
  };
}

interface Ctx {
  db: Db;
  teamId: number;
  users: Record<Who, { id: number; email: string; name: string }>;
  baseUrl: string;
}

function mail(ctx: Ctx, to: Who, subject: string, paragraphs: string[], quote: string | undefined, link: { label: string; url: string }) {
  const user = ctx.users[to];
  const { text, html } = renderMail({ to: user.email, subject, paragraphs, quote, link });
  const from = 'Phasewright <noreply@phasewright.local>';
  storeMail(ctx.db, {
    teamId: ctx.teamId,
    fromAddress: from,
    toAddress: user.email,
    subject,
    text,
    html,
    raw: `From: ${from}\r\nTo: ${user.email}\r\nSubject: ${subject}\r\nX-Phasewright-Team: ${ctx.teamId}\r\n\r\n${text}`,
  });
}

/** Submit a revision to the demo reviewer, as the designer, with the mail it sends. */
function submit(
  ctx: Ctx,
  ref: { teamId: number; designId: number; revisionId: number; number: number },
  designName: string,
  message: string,
  input: AnalyzeRequest & RangeFields,
) {
  submitForReview(ctx.db, ref, { actorId: ctx.users.designer.id, reviewerId: ctx.users.reviewer.id, message });
  const label = `${designName} r${ref.number}`;
  // As the submit route does: the reviewer signs off the worst case, so the mail states it.
  const range = summarizeRange(input);
  const worstCase = range.ok ? worstCaseSentence(range.value) : `Worst case not available: ${range.message}`;
  mail(ctx, 'reviewer', `Review requested: ${label}`, [`Hello ${ctx.users.reviewer.name},`, `${LABELS.designer} asks you to review ${label} and sign it off.`, worstCase], message, {
    label: `Open r${ref.number}`,
    url: `${ctx.baseUrl}/designs/${ref.designId}/history?r=${ref.number}`,
  });
}

function playStory(ctx: Ctx, story: DemoStory) {
  const sample = { request: typeof story.sample === 'string' ? sampleRequest(story.sample) : story.sample };
  const design = createDesign(ctx.db, ctx.users.designer.id, ctx.teamId, {
    name: story.name,
    description: story.description,
    topology: sample.request.converter.topology,
  });
  let base: number | null = null;
  for (const step of story.revisions) {
    const input: AnalyzeRequest & RangeFields = {
      ...sample.request,
      modulator: step.modulator ?? sample.request.modulator,
      compensator: { ...sample.request.compensator, ...step.compensator },
    };
    const rev = createRevision(ctx.db, {
      teamId: ctx.teamId,
      designId: design.id,
      baseNumber: base,
      input,
      summary: summarizeAnalysis(analyze(input)),
      authorId: ctx.users.designer.id,
      note: step.note,
    });
    base = rev.number;
    const ref = { teamId: ctx.teamId, designId: design.id, revisionId: rev.id, number: rev.number };
    const label = `${story.name} r${rev.number}`;
    const historyUrl = `${ctx.baseUrl}/designs/${design.id}/history?r=${rev.number}`;
    for (const run of step.bench ?? [])
      createBenchData(ctx.db, {
        teamId: ctx.teamId,
        designId: design.id,
        revisionId: rev.id,
        name: run.name,
        points: benchPointsFor(input, run),
        phaseShifted: false,
        uploadedBy: ctx.users.designer.id,
      });
    if (!step.review) continue;
    submit(ctx, ref, story.name, step.review.submit, input);
    for (const r of step.review.remarks ?? []) {
      addRemark(ctx.db, { ...ref, authorId: ctx.users[r.by].id, body: r.body, comparedWith: r.comparedWith ?? null });
      // To the author and the reviewer asked, never to the writer (as the remarks route does).
      for (const to of (['designer', 'reviewer'] as const).filter((w) => w !== r.by)) {
        const where = r.comparedWith ? ` while comparing it with r${r.comparedWith}` : '';
        mail(ctx, to, `Remark on ${label}`, [`Hello ${ctx.users[to].name},`, `${LABELS[r.by]} left a remark on ${label}${where}.`], r.body, r.comparedWith
          ? { label: `Open the comparison r${r.comparedWith} → r${rev.number}`, url: `${ctx.baseUrl}/designs/${design.id}/compare?a=${r.comparedWith}&b=${rev.number}` }
          : { label: `Open r${rev.number}`, url: historyUrl });
      }
    }
    const d = step.review.decision;
    if (d) {
      decideSignoff(ctx.db, ref, { actorId: ctx.users.reviewer.id, decision: d.decision, message: d.message });
      const approved = d.decision === 'approve';
      mail(
        ctx,
        'designer',
        `${approved ? 'Approved' : 'Changes requested'}: ${label}`,
        [
          `Hello ${ctx.users.designer.name},`,
          approved
            ? `${LABELS.reviewer} approved ${label}.`
            : `${LABELS.reviewer} requested changes to ${label}. Save a new revision with the changes and submit it again.`,
        ],
        d.message,
        { label: `Open r${rev.number}`, url: historyUrl },
      );
    }
  }
}

/**
 * Play every story whose design does not exist yet, and put the waiting design in review once
 * (idempotent: a second run finds the designs and the second revision and does nothing).
 */
export function seedStories(
  db: Db,
  teamId: number,
  users: Record<Who, { id: number; email: string; name: string }>,
  existing: Map<string, { id: number; latestRevision: number | null }>,
) {
  const ctx: Ctx = { db, teamId, users, baseUrl: (process.env.NEXTAUTH_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/+$/, '') };
  for (const story of DEMO_STORIES) if (!existing.has(story.name)) playStory(ctx, story);

  const waiting = existing.get(DEMO_WAITING.name);
  if (waiting && waiting.latestRevision === 1) {
    const request = sampleRequest('buck-24v-5v');
    const c = request.compensator;
    const input: AnalyzeRequest = { ...request, compensator: { ...c, r1: c.r1 * DEMO_WAITING.revision.r1Scale } };
    const rev = createRevision(db, {
      teamId,
      designId: waiting.id,
      baseNumber: 1,
      input,
      summary: summarizeAnalysis(analyze(input)),
      authorId: users.designer.id,
      note: DEMO_WAITING.revision.note,
    });
    submit(ctx, { teamId, designId: waiting.id, revisionId: rev.id, number: rev.number }, DEMO_WAITING.name, DEMO_WAITING.message, input);
  }
}
