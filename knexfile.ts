/** Knex CLI entry; the app and scripts build the same settings from src/lib/server/config.ts. */
import { knexConfig } from './src/lib/server/db';

export default knexConfig();
