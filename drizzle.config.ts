import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  schema: ['./server/db/schema.ts', './server/db/schema-work.ts', './server/db/schema-disputes.ts'],
  out: './drizzle',
  casing: 'snake_case',
  strict: true,
  dbCredentials: {
    url: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/tenthmark',
  },
});
