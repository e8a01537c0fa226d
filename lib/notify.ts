import 'server-only';

/**
 * Team notifications by e-mail. Filled in by the mail feature; until then
 * these are no-ops so callers can already announce their events.
 */
export async function notifyAddedToTeam(_m: { to: string; name: string; teamName: string; role: string; by: string }) {}
