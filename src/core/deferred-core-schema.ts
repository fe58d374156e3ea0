// The zod schema of core.json: zod takes tens of milliseconds to load, and only a core needs it.
// Compiled by tsc this is a plain import; in the bundle, scripts/bundle.mjs defers it to the first call.
import * as coreSchema from './core-schema.js';

export const coreSchemaModule = () => coreSchema;
