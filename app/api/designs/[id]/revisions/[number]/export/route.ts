import { getDb } from '@/db/client';
import { getBenchData, getSignoffState, listBenchData, listRemarks, listSignoffEvents } from '@/db/queries';
import { HttpError, withUser } from '@/lib/api';
import { analyze } from '@/lib/engine/analyze';
import { buildExport } from '@/lib/handoff/exports';
import { contentDisposition, EXPORT_FORMATS, type ExportFormat } from '@/lib/handoff/files';
import { benchForReport } from '@/lib/handoff/report-bench';
import { requireRevision } from '@/lib/revision-access';

type P = { id: string; number: string };

/**
 * A revision as a file: ?format=csv (parts list), json (design file), spice (.cir netlist)
 * or report (printable HTML). Every role may export. ?inline=1 shows the file in the browser
 * (the report opens in a tab to print) instead of downloading it.
 */
export const GET = withUser<P>(async (req, { user, params }) => {
  const url = new URL(req.url);
  const format = (url.searchParams.get('format') ?? 'csv') as ExportFormat;
  if (!EXPORT_FORMATS.includes(format))
    throw new HttpError(400, 'Unknown export format', [{ path: 'format', message: `format must be one of ${EXPORT_FORMATS.join(', ')}` }]);
  const { design, revision } = requireRevision(user, params);
  const db = getDb();
  const input = revision.input;
  const events = listSignoffEvents(db, revision.id);
  const last = events.at(-1);
  // The report also carries the review and the bench: the trail, the remarks, and up to six
  // bench data sets of this revision, each against this revision's model.
  const review =
    format === 'report'
      ? {
          trail: events.map((e) => ({ state: e.state, actorName: e.actorName, reviewerName: e.reviewerName, message: e.message, at: e.createdAt })),
          remarks: listRemarks(db, revision.id).map((m) => ({ authorName: m.authorName, body: m.body, at: m.createdAt, comparedWith: m.comparedWith })),
          bench: listBenchData(db, user.teamId, design.id, { revisionNumber: revision.number })
            .slice(0, 6)
            .map((b) => getBenchData(db, user.teamId, design.id, b.id))
            .filter((b) => b !== undefined)
            .map((b) => benchForReport(input, b)),
        }
      : {};
  const file = buildExport(format, {
    ...review,
    design,
    revision: { ...revision, input },
    signoff: { state: getSignoffState(db, revision.id), at: last?.createdAt ?? null, by: last?.actorName ?? null },
    result: analyze(input),
    teamName: user.teamName,
  });
  const headers: Record<string, string> = {
    'content-type': file.contentType,
    'content-disposition': contentDisposition(file.fileName, url.searchParams.get('inline') === '1'),
    'cache-control': 'private, no-store',
    'x-content-type-options': 'nosniff',
  };
  // The report is our own markup with inline styles and SVG: nothing else may load or run.
  if (format === 'report') headers['content-security-policy'] = "default-src 'none'; style-src 'unsafe-inline'; img-src data:";
  return new Response(file.body, { status: 200, headers });
});
