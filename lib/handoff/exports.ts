/**
 * One entry for every Handoff export of a revision: body, content type and file name.
 * Pure: the route handler loads the design, revision and sign-off, runs the analysis and
 * passes them in.
 */
import { analyze } from '@/lib/engine/analyze';
import type { SignoffState } from '@/lib/catalog/signoff';
import type { AnalyzeRequest, AnalyzeResult, Topology } from '@/lib/engine/types';
import { builtRequest, partsAreStandard } from './built-parts';
import { buildDesignFile, designFileJson } from './design-file';
import { EXPORT_CONTENT_TYPE, exportFileName, type ExportFormat } from './files';
import { buildPartsList, partsListCsv } from './parts-list';
import { buildReportHtml, type ReportInput } from './report';
import { spiceNetlistFile } from './spice';

export interface ExportContext {
  design: { name: string; description: string; topology: Topology; designatorMap: Record<string, string> };
  revision: { number: number; note: string; createdAt: Date; authorName: string; input: AnalyzeRequest };
  signoff: { state: SignoffState; at: Date | null; by: string | null };
  result: AnalyzeResult;
  teamName: string;
  now?: Date;
  /** For the report: sign-off events, remarks and bench data of the revision. */
  trail?: ReportInput['trail'];
  remarks?: ReportInput['remarks'];
  bench?: ReportInput['bench'];
}

export interface ExportFile {
  body: string;
  contentType: string;
  fileName: string;
}

export function buildExport(format: ExportFormat, ctx: ExportContext): ExportFile {
  const { design, revision, result } = ctx;
  const parts = () => buildPartsList(result.parts, revision.input.compensator.type, design.designatorMap, revision.input.compensator.amplifier);
  let body: string;
  switch (format) {
    case 'csv':
      body = partsListCsv(parts());
      break;
    case 'json':
      body = designFileJson(buildDesignFile({ design, revision, result, now: ctx.now }));
      break;
    case 'spice':
      body = spiceNetlistFile({ designName: design.name, revision: revision.number, input: revision.input, parts: result.parts });
      break;
    case 'report':
      body = buildReportHtml({
        design,
        revision,
        signoff: ctx.signoff,
        input: revision.input,
        result,
        // The plot shows the loop as built (standard values) unless the parts already are standard.
        builtBode: partsAreStandard(result.parts) ? result.bode : analyze(builtRequest(revision.input, result.parts)).bode,
        parts: parts(),
        teamName: ctx.teamName,
        generatedAt: ctx.now,
        trail: ctx.trail,
        remarks: ctx.remarks,
        bench: ctx.bench,
      });
      break;
  }
  return { body, contentType: EXPORT_CONTENT_TYPE[format], fileName: exportFileName(design.name, revision.number, format) };
}
