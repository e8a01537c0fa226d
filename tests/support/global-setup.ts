import type { TestProject } from 'vitest/node';
import { startFakeSmtp } from '@/lib/fake-smtp';
import { buildIfStale, freePort, startApp } from './app-server';

/**
 * One build and one seeded server shared by every API test file, with the
 * local fake mail server listening on the app's SMTP_PORT and keeping mail
 * in the app's database (known once the app has started).
 */
export default async function setup(project: TestProject) {
  buildIfStale();
  const smtpPort = await freePort();
  let dbPath = '';
  const smtp = await startFakeSmtp({ port: smtpPort, database: () => dbPath });
  const app = await startApp({ SMTP_PORT: String(smtpPort) });
  dbPath = app.dbPath;
  project.provide('baseUrl', app.baseUrl);
  project.provide('dbPath', app.dbPath);
  project.provide('smtpPort', app.smtpPort);
  project.provide('appPid', app.pid);
  return async () => {
    await smtp.close();
    await app.stop();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    dbPath: string;
    smtpPort: number;
    appPid: number;
  }
}
