import type { TestProject } from 'vitest/node';
import { buildIfStale, startApp } from './app-server';

/** One build and one seeded server shared by every API test file. */
export default async function setup(project: TestProject) {
  buildIfStale();
  const app = await startApp();
  project.provide('baseUrl', app.baseUrl);
  project.provide('dbPath', app.dbPath);
  project.provide('smtpPort', app.smtpPort);
  return () => app.stop();
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    dbPath: string;
    smtpPort: number;
  }
}
