// drizzle-kit reads the schema module and writes SQL migrations into drizzle/ (`npm run db:generate`).
// The migrations are committed; server/db/client.ts applies them at start.
import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './drizzle',
});
