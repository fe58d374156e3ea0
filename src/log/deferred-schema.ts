// The zod schemas of session lines. zod and the schemas take tens of milliseconds to load
// and build, and a good line never needs them (check-event.ts checks it by hand): they word
// an error, or check a kind that has no hand check yet. Compiled by tsc (tests, bench) this
// is a plain import; in the bundle users run, scripts/bundle.mjs defers it to the first call.
import * as eventSchema from './event-schema.js';

export const eventSchemaModule = () => eventSchema;
