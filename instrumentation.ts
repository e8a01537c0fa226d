/** Runs once when the server starts: apply migrations, seed demo data when asked. */
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { openDatabase } = await import('./db/connection');
  const db = openDatabase();
  if (process.env.PHASEWRIGHT_DEMO === '1') {
    const { seedDemo } = await import('./db/seed');
    seedDemo(db);
  }
  db.$client.close();
}
