// Writes shared/schema/<kind>.schema.json from the shapes in shared/schema/shapes.ts.
// `npm run schema` after changing a shape; tests/shared/schema-drift.test.ts checks they agree.
import { writeFileSync } from 'node:fs';
import { renderJsonSchemas } from '../shared/schema/render.ts';

for (const [kind, text] of Object.entries(renderJsonSchemas())) {
  writeFileSync(new URL(`../shared/schema/${kind}.schema.json`, import.meta.url), text);
  console.log(`wrote shared/schema/${kind}.schema.json`);
}
