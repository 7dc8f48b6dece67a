// The whole database schema, one file per domain. Everything imports tables from here
// (`server/db/schema`); drizzle.config.ts and the relational query client read this file.
export * from './users-and-sessions';
export * from './shops';
export * from './jobs';
export * from './messages';
export * from './work';
export * from './money';
export * from './disputes-and-reviews';
export * from './platform';
export * from './notifications';
