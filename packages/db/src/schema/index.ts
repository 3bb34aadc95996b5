export * from './operations.js';
export * from './parties.js';
export * from './users.js';
export * from './auth.js';
export * from './audit.js';
