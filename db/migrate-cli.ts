import { openDatabase, resolveDatabasePath } from './connection';

const db = openDatabase();
db.$client.close();
console.log(`Migrations applied to ${resolveDatabasePath()}`);
