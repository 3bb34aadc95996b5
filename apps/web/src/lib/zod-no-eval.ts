// zod compiles object parsers with new Function() when it may; the content security policy forbids
// eval, and zod's probe for it would be reported as a violation on every page load. zod keeps its
// settings on this global so that every copy of it shares them, and reads it when a schema is built:
// setting it here, before any chunk with a schema loads, keeps zod itself out of the entry.
const holder = globalThis as { __zod_globalConfig?: Record<string, unknown> };
holder.__zod_globalConfig = { ...holder.__zod_globalConfig, jitless: true };
export {};
