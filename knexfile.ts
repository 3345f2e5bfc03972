import { loadConfig } from './server/config';
import { knexSettings } from './server/db/knex';

// For tools that expect a knexfile; the app itself builds the same settings in server/db/knex.ts.
export default knexSettings(loadConfig());
