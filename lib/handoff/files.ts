/**
 * File names and content types of the Handoff exports:
 * `<design-slug>-r<N>-parts.csv`, `<design-slug>-r<N>.json`, `<design-slug>-r<N>.cir`,
 * `<design-slug>-r<N>-report.html`.
 */
export const EXPORT_FORMATS = ['csv', 'json', 'spice', 'report'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export const EXPORT_CONTENT_TYPE: Record<ExportFormat, string> = {
  csv: 'text/csv; charset=utf-8',
  json: 'application/json; charset=utf-8',
  spice: 'text/plain; charset=utf-8',
  report: 'text/html; charset=utf-8',
};

/** Lower-case ASCII words joined by hyphens ("5 V rail, motor board" → "5-v-rail-motor-board"). */
export function slugify(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return slug || 'design';
}

export function exportFileName(designName: string, revision: number, format: ExportFormat): string {
  const base = `${slugify(designName)}-r${revision}`;
  switch (format) {
    case 'csv':
      return `${base}-parts.csv`;
    case 'json':
      return `${base}.json`;
    case 'spice':
      return `${base}.cir`;
    case 'report':
      return `${base}-report.html`;
  }
}

/** Content-Disposition with an ASCII name and the RFC 5987 form. */
export function contentDisposition(fileName: string, inline = false): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${inline ? 'inline' : 'attachment'}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
