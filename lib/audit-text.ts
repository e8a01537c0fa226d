/** One audit-log entry in words for the Team page's activity list. */
export function describeAudit(e: { action: string; entityType: string; entityId: number | null; detail: unknown }): string {
  const d = (e.detail ?? {}) as Record<string, unknown>;
  const rev = d.number ? `r${d.number}` : `revision #${e.entityId}`;
  switch (e.action) {
    case 'design.created':
      return `created design “${d.name ?? e.entityId}”`;
    case 'design.updated':
      return `edited design #${e.entityId}${Array.isArray(d.fields) ? ` (${d.fields.join(', ')})` : ''}`;
    case 'revision.saved':
      return `saved ${rev} of design #${d.designId ?? '?'}`;
    case 'member.added':
      return `added ${d.email ?? 'a member'} as ${d.role ?? '?'}`;
    case 'member.role-changed':
      return `changed a role from ${d.from} to ${d.to}`;
    case 'remark.added':
      return `remarked on ${rev}`;
    case 'bench.uploaded':
      return `uploaded bench data${d.name ? ` “${d.name}”` : ''}`;
    case 'bench.deleted':
      return 'deleted bench data';
    case 'bench.phase-shift':
      return 'shifted bench data phase by 180°';
    default:
      if (e.action.startsWith('signoff.')) return `set ${rev} to ${e.action.slice('signoff.'.length).replace('-', ' ')}`;
      return `${e.action} ${e.entityType} #${e.entityId ?? ''}`.trim();
  }
}
