// The keymap's zod schema, needed only to word what is wrong with a keymap (see log/deferred-schema.ts).
import * as keymapSchema from './keymap-schema.js';

export const keymapSchemaModule = () => keymapSchema;
