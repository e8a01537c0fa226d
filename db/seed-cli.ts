import { openDatabase, resolveDatabasePath } from './connection';
import { seedDemo } from './seed';

const db = openDatabase();
seedDemo(db);
db.$client.close();
console.log(`Demo data seeded into ${resolveDatabasePath()}`);
