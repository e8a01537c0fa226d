/** Team roles, most rights first (the database enum, the zod schema and the Team page's selects read this). */
export const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];
