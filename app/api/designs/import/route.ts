import { NextResponse } from 'next/server';
import { getDb } from '@/db/client';
import { importDesign } from '@/db/queries';
import { can } from '@/lib/auth';
import { HttpError, withUser } from '@/lib/api';
import { analyze } from '@/lib/engine/analyze';
import { readDesignFile, resultsMatch } from '@/lib/handoff/design-file';
import { importedDesignBody } from '@/lib/response-bodies';
import { summarizeAnalysis } from '@/lib/revision-summary';

const MAX_BYTES = 1024 * 1024;

/**
 * A new design from a design file (the JSON export). The file's analysis request becomes
 * revision r1 of the new design; `resultsMatch` says whether the re-analysis reproduced the
 * crossover and margins stored in the file.
 */
export const POST = withUser(
  async (req, { user }) => {
    const text = await req.text();
    if (Buffer.byteLength(text) > MAX_BYTES) throw new HttpError(413, 'A design file is at most 1 MB', [{ path: 'file', message: 'at most 1 MB' }]);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw new HttpError(400, 'The file is not valid JSON', [{ path: '(body)', message: 'expected a Phasewright design file (.json)' }]);
    }
    const read = readDesignFile(body);
    if (!read.ok) throw new HttpError(400, read.error, read.issues);
    const result = analyze(read.input); // EngineInputError → 422
    const { design, revision } = read.file;
    const source = revision?.number ? `r${revision.number} of “${design.name}”` : `“${design.name}”`;
    const created = importDesign(getDb(), user.id, user.teamId, {
      name: design.name,
      description: design.description ?? '',
      topology: design.topology,
      designatorMap: design.designatorMap as Record<string, string>,
      input: read.input,
      summary: summarizeAnalysis(result),
      note: `Imported from a design file (${source})`,
    });
    return NextResponse.json(importedDesignBody(created, design.name, resultsMatch(read.file.results, result.margins), result.margins), { status: 201 });
  },
  { allow: can.editDesigns, action: 'import designs', maxBytes: MAX_BYTES },
);
