const FILES = [
  { format: 'csv', label: 'Parts list', ext: '.csv' },
  { format: 'spice', label: 'SPICE netlist', ext: '.cir' },
  { format: 'json', label: 'Design file', ext: '.json' },
  { format: 'report', label: 'Report', ext: '.html' },
] as const;

export function ExportButtons({ designId, revision }: { designId: number; revision: number }) {
  const base = `/api/designs/${designId}/revisions/${revision}/export`;
  return (
    <div className="ml-auto flex flex-wrap items-center gap-2" data-testid="export-buttons">
      {FILES.map((f) => (
        <a key={f.format} href={`${base}?format=${f.format}`} download className="btn-secondary" data-format={f.format}>
          <span aria-hidden>⤓</span> {f.label} <span className="text-xs text-slate-500">{f.ext}</span>
        </a>
      ))}
      <a href={`${base}?format=report&inline=1`} target="_blank" rel="noopener" className="btn-primary">
        Open report to print
      </a>
    </div>
  );
}
