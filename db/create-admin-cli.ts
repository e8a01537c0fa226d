/**
 * First admin of a real deployment:
 *   npm run create-admin -- --email you@company.com --name "Your Name" --team "Power team"
 * The password is read from PHASEWRIGHT_ADMIN_PASSWORD or asked on the terminal.
 */
import { parseArgs } from 'node:util';
import readline from 'node:readline/promises';
import { openDatabase } from './connection';
import { createTeam, createUser, getUserByEmail } from './queries';
import { memberships } from './schema';

const { values } = parseArgs({
  options: { email: { type: 'string' }, name: { type: 'string' }, team: { type: 'string' } },
});
if (!values.email || !values.name || !values.team) {
  console.error('usage: npm run create-admin -- --email EMAIL --name NAME --team TEAM');
  process.exit(2);
}
let password = process.env.PHASEWRIGHT_ADMIN_PASSWORD;
if (!password) {
  const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
  password = await rl.question('Password (8+ characters): ');
  rl.close();
}
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
