import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { createBenchData, getLatestRevision, getRevision, listBenchData } from '@/db/queries';
import { can } from '@/lib/auth';
import { HttpError, parseId, withUser } from '@/lib/api';
import { benchUploadedBody } from '@/lib/handoff/bench-responses';
import { BENCH_MAX_BYTES, BenchParseError, parseBenchData, type FrequencyUnit } from '@/lib/handoff/bench-parse';
import { requireActiveDesign, requireDesign } from '@/lib/design-access';

type P = { id: string };

/** Room for multipart boundaries and fields around a file at the limit. */
const MULTIPART_SLACK = 64 * 1024;
const UNITS: FrequencyUnit[] = ['Hz', 'kHz', 'MHz'];

/** Bench data of the design, newest first; ?revision=N: that revision's (and any design-wide data). */
export const GET = withUser<P>(async (req, { user, params }) => {
  const design = requireDesign(user, params.id);
  const rev = new URL(req.url).searchParams.get('revision');
  const revisionNumber = rev === null ? undefined : parseId(rev, 'revision');
  return NextResponse.json({ benchData: listBenchData(getDb(), user.teamId, design.id, { revisionNumber }) });
});

const tooLarge = () => new HttpError(413, `Bench data files are at most ${BENCH_MAX_BYTES / 1024 / 1024} MB`, [{ path: 'file', message: 'the file is too large' }]);

interface Upload {
  bytes: Uint8Array;
  name: string;
  /** The revision measured; the latest when not given. */
  revision?: string;
  frequencyUnit?: FrequencyUnit;
  phaseShifted: boolean;
}

/** A multipart form (field `file`, optional `name`, `frequencyUnit`, `phaseShifted`) or a raw text body with the same as query parameters. */
async function readUpload(req: Request): Promise<Upload> {
  const url = new URL(req.url);
  const type = req.headers.get('content-type') ?? '';
  // withUser has already read the body under its byte limit (maxBytes below); a raw text body
  // over the file limit is refused by parseBenchData (413).
  const raw = new Uint8Array(await req.arrayBuffer());
  let bytes = raw;
  let fileName = '';
  let fields: (k: string) => string | null = (k) => url.searchParams.get(k);
  if (type.startsWith('multipart/form-data')) {
    const form = await new Response(raw as BodyInit, { headers: { 'content-type': type } }).formData().catch(() => {
      throw new HttpError(400, 'The upload is not a readable form', [{ path: 'file', message: 'send the file as multipart/form-data field "file"' }]);
    });
    const file = form.get('file');
    if (!(file instanceof Blob))
      throw new HttpError(400, 'No file in the upload', [{ path: 'file', message: 'send the measurement as the form field "file"' }]);
    if (file.size > BENCH_MAX_BYTES) throw tooLarge();
    bytes = new Uint8Array(await file.arrayBuffer());
    fileName = 'name' in file && typeof file.name === 'string' ? file.name : '';
    fields = (k) => {
      const v = form.get(k);
      return typeof v === 'string' ? v : url.searchParams.get(k);
    };
  }
  const unit = fields('frequencyUnit');
  if (unit && !UNITS.includes(unit as FrequencyUnit))
    throw new HttpError(400, 'Unknown frequency unit', [{ path: 'frequencyUnit', message: 'frequencyUnit must be Hz, kHz or MHz' }]);
  const name = (fields('name') || fileName || `Bench data ${new Date().toISOString().slice(0, 16).replace('T', ' ')}`).trim().slice(0, 120);
  return { bytes, name, revision: fields('revision') || undefined, frequencyUnit: (unit as FrequencyUnit) || undefined, phaseShifted: ['1', 'true', 'on'].includes(fields('phaseShifted') ?? '') };
}

/**
 * Upload bench data (designer, admin) for one revision (field or query `revision`, default the
 * latest): the board measured was built from that revision. A file that cannot be read answers
 * 422 naming the line and the problem, 413 when too large; nothing is stored then.
 */
export const POST = withUser<P>(
  async (req, { user, params }) => {
    const design = requireActiveDesign(user, params.id);
    const upload = await readUpload(req);
    const db = getDb();
    let revision;
    if (upload.revision !== undefined) {
      const n = Number(upload.revision);
      revision = Number.isInteger(n) && n > 0 ? getRevision(db, design.id, n) : undefined;
      if (!revision) throw new HttpError(422, `There is no revision r${upload.revision} to attach the bench data to`, [{ path: 'revision', message: 'name a saved revision of this design' }]);
    } else {
      revision = getLatestRevision(db, design.id);
      if (!revision) throw new HttpError(422, 'Save a revision first: bench data is compared with the model of the revision measured', [{ path: 'revision', message: 'the design has no revision yet' }]);
    }
    let parsed;
    try {
      parsed = parseBenchData(upload.bytes, { frequencyUnit: upload.frequencyUnit });
    } catch (err) {
      if (!(err instanceof BenchParseError)) throw err;
      const issue = { path: err.line === null ? 'file' : `line ${err.line}`, message: err.problem };
      throw new HttpError(err.tooLarge ? 413 : 422, `The bench data was not stored: ${err.message}`, [issue], { line: err.line });
    }
    const id = createBenchData(db, {
      teamId: user.teamId,
      designId: design.id,
      revisionId: revision.id,
      name: upload.name,
      points: parsed.points,
      phaseShifted: upload.phaseShifted,
      uploadedBy: user.id,
    });
    return NextResponse.json({ ...benchUploadedBody(id, upload.name, upload.phaseShifted, parsed), revision: revision.number }, { status: 201 });
  },
  { body: 'upload', maxBytes: BENCH_MAX_BYTES + MULTIPART_SLACK, allow: can.editDesigns, action: 'upload bench data' },
);
