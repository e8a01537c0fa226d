/**
 * First admin of a real deployment:
 *   npm run create-admin -- --email you@company.com --name "Your Name" --team "Power team"
 * The password never goes on the command line: it is asked on the terminal
 * (not echoed), read from standard input when that is a pipe, or taken from
 * PHASEWRIGHT_ADMIN_PASSWORD.
 * No top-level await: tsx runs this file as CommonJS (package.json has no "type"), which has none.
 */
import { parseArgs } from 'node:util';
import { openDatabase } from './connection';
import { createTeam, createUser, getUserByEmail } from './queries';
import { memberships } from './schema';

/** All of a piped standard input, without the final newline. */
function readPipedStdin(): Promise<string> {
  return new Promise((resolve, reject) => {
    let data = '';
    process.stdin.setEncoding('utf8');
    process.stdin.on('data', (c) => (data += c));
    process.stdin.on('end', () => resolve(data.replace(/\r?\n$/, '')));
    process.stdin.on('error', reject);
  });
}

/** Ask on the terminal without echoing what is typed. */
function promptHidden(question: string): Promise<string> {
  return new Promise((resolve) => {
    const stdin = process.stdin;
    process.stdout.write(question);
    stdin.setRawMode(true);
    stdin.resume();
    stdin.setEncoding('utf8');
    let value = '';
    const onData = (ch: string) => {
      for (const c of ch) {
        if (c === '\r' || c === '\n' || c === '\u0004') {
          stdin.setRawMode(false);
          stdin.pause();
          stdin.off('data', onData);
          process.stdout.write('\n');
          resolve(value);
          return;
        }
        if (c === '\u0003') process.exit(130);
        if (c === '\u007f') value = value.slice(0, -1);
        else value += c;
      }
    };
    stdin.on('data', onData);
  });
}

async function readPassword(): Promise<string> {
  if (process.env.PHASEWRIGHT_ADMIN_PASSWORD) return process.env.PHASEWRIGHT_ADMIN_PASSWORD;
  if (!process.stdin.isTTY) return readPipedStdin();
  const first = await promptHidden('Password (8+ characters): ');
  const again = await promptHidden('Password again: ');
  if (first !== again) {
    console.error('password: the two entries differ');
    process.exit(2);
  }
  return first;
}

async function main() {
  const { values } = parseArgs({
    options: { email: { type: 'string' }, name: { type: 'string' }, team: { type: 'string' } },
  });
  if (!values.email || !values.name || !values.team) {
    console.error('usage: npm run create-admin -- --email EMAIL --name NAME --team TEAM   (password: asked, piped on stdin, or PHASEWRIGHT_ADMIN_PASSWORD)');
    process.exit(2);
  }
  const password = await readPassword();
  if (password.length < 8) {
    console.error('password: at least 8 characters');
    process.exit(2);
  }
  const db = openDatabase();
  if (getUserByEmail(db, values.email)) {
    console.error(`email: ${values.email} already has an account`);
    process.exit(1);
  }
  const slug = values.team.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'team';
  const team = createTeam(db, { name: values.team, slug });
  const user = createUser(db, { email: values.email, name: values.name, password });
  db.insert(memberships).values({ userId: user.id, teamId: team.id, role: 'admin' }).run();
  db.$client.close();
  console.log(`Created admin ${user.email} of team "${team.name}"`);
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
