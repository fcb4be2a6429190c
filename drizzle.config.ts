import { defineConfig } from 'drizzle-kit';

export default defineConfig({
	schema: ['./src/lib/server/db/schema.ts', './src/lib/server/db/site-schema.ts', './src/lib/server/db/recipe-schema.ts', './src/lib/server/db/export-schema.ts'],
	out: './drizzle',
	dialect: 'sqlite',
	dbCredentials: { url: process.env.DATABASE_URL ?? './data/conefield.db' }
});
