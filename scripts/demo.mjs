#!/usr/bin/env node
/**
 * `npm run demo`: migrate, seed the demo team, start the local fake mail
 * server, build and serve on http://localhost:$PORT (default 3000).
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';

const env = { ...process.env, PHASEWRIGHT_DEMO: '1', NEXT_TELEMETRY_DISABLED: '1' };
const port = env.PORT || '3000';
env.PORT = port;
env.SMTP_PORT ||= '2525';

function run(cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

console.log('› Applying migrations and seeding demo data');
run('npx', ['tsx', 'db/migrate-cli.ts']);
run('npx', ['tsx', 'db/seed-cli.ts']);

const children = [];
if (fs.existsSync('scripts/fake-smtp.ts')) {
  console.log(`› Starting the local fake mail server on 127.0.0.1:${env.SMTP_PORT}`);
  children.push(spawn('npx', ['tsx', 'scripts/fake-smtp.ts'], { stdio: 'inherit', env }));
}

console.log('› Building the app');
run('npx', ['next', 'build']);
run('node', ['scripts/precompress.mjs']);

console.log(`› Serving Phasewright on http://localhost:${port}`);
const server = spawn('node', ['scripts/serve.mjs'], { stdio: 'inherit', env });
children.push(server);
const stop = () => children.forEach((c) => c.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
server.on('exit', (code) => {
  stop();
  process.exit(code ?? 0);
});
