/** `npm run db:migrate`: start the project's PostgreSQL if needed and migrate the main database. */
import { prepareDatabase } from './database';
import { startPostgres } from './postgres';

const pgHandle = startPostgres();
try {
  const url = await prepareDatabase(pgHandle, process.env.NODEWRIGHT_DB ?? 'nodewright');
  console.log(`Migrated ${url}`);
} catch (e) {
  console.error((e as Error).message);
  process.exitCode = 1;
} finally {
  pgHandle.stop();
}
