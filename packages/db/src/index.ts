export * from './client.js';
export * as schema from './schema/index.js';
export * from './schema/index.js';
export * from './errors.js';
