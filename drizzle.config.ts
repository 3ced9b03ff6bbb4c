import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'sqlite',
  schema: './apps/server/src/db/schema.ts',
  out: './apps/server/src/db/migrations',
  casing: 'snake_case',
  dbCredentials: {
    url: process.env.DATA_DIR
      ? `${process.env.DATA_DIR}/emberline.sqlite`
      : './data/emberline.sqlite',
  },
});
