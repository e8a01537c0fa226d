/**
 * `npx tsx scripts/fake-smtp.ts`: the local fake mail server for the demo.
 * Listens on 127.0.0.1:$SMTP_PORT (default 2525) and keeps every message in
 * the mailbox table of $DATABASE_URL; read them at /mailbox (admin, demo only).
 */
import { resolveDatabasePath } from '@/db/connection';
import { startFakeSmtp } from '@/lib/fake-smtp';

const port = Number(process.env.SMTP_PORT ?? 2525);
const database = resolveDatabasePath();

startFakeSmtp({ port, database })
  .then((smtp) => {
    console.log(`[fake-smtp] listening on 127.0.0.1:${port}, keeping mail in ${database}`);
    const stop = (signal: string) => {
      console.log(`[fake-smtp] ${signal}: stopping after ${smtp.count()} message(s)`);
      void smtp.close().then(() => process.exit(0));
    };
    process.on('SIGINT', () => stop('SIGINT'));
    process.on('SIGTERM', () => stop('SIGTERM'));
  })
  .catch((err) => {
    console.error(`[fake-smtp] could not listen on 127.0.0.1:${port}: ${err.message}`);
    process.exit(1);
  });
