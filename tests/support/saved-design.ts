import type { Client } from './http';

export type AnalyzeInput = {
  converter: { topology: string; [k: string]: unknown };
  compensator: { [k: string]: unknown };
  [k: string]: unknown;
};

/** The input of a seeded demo revision: a known-good analysis request. */
export async function demoInput(client: Client): Promise<AnalyzeInput> {
  const { designs } = await (await client.fetch('/api/designs')).json();
  // The demo's buck-boost (its first revision is a plain, well-margined design); else any saved design.
  const seeded =
    designs.find((d: { name: string }) => d.name === '−12 V bias — motor current amplifier') ?? designs.find((d: { latestRevision: number | null }) => d.latestRevision);
  const rev = await (await client.fetch(`/api/designs/${seeded.id}/revisions/1`)).json();
  return rev.input;
}

/** A new design of this test's own, with r1 saved by `client` (a designer or admin). */
export async function savedDesign(client: Client, name: string) {
  const input = await demoInput(client);
  const created = await client.json('/api/designs', 'POST', { name, topology: input.converter.topology });
  if (created.status !== 201) throw new Error(`could not create a design: ${created.status} ${await created.text()}`);
  const design = await created.json();
  const saved = await client.json(`/api/designs/${design.id}/revisions`, 'POST', { baseRevision: null, note: 'first', input });
  if (saved.status !== 201) throw new Error(`could not save r1: ${saved.status} ${await saved.text()}`);
  return { designId: design.id as number, input };
}

/** The same input with one compensator value scaled (a visible change in Compare). */
export function tweak(input: AnalyzeInput, part = 'r1', factor = 0.8): AnalyzeInput {
  const value = input.compensator[part];
  return { ...input, compensator: { ...input.compensator, [part]: typeof value === 'number' ? value * factor : value } };
}
