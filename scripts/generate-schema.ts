// Writes shared/schema/<kind>.schema.json from the shapes in shared/schema/shapes.ts, and the
// validators compiled from them (shared/schema/validators.generated.ts). `npm run schema` after
// changing a shape; tests/shared/schema-drift.test.ts checks the committed files agree.
import { writeFileSync } from 'node:fs';
import { renderJsonSchemas } from '../shared/schema/render.ts';
import { renderValidatorsModule } from './schema-validators.mjs';

const schemas = renderJsonSchemas();
for (const [kind, text] of Object.entries(schemas)) {
  writeFileSync(new URL(`../shared/schema/${kind}.schema.json`, import.meta.url), text);
  console.log(`wrote shared/schema/${kind}.schema.json`);
}
writeFileSync(new URL('../shared/schema/validators.generated.ts', import.meta.url), renderValidatorsModule(schemas));
console.log('wrote shared/schema/validators.generated.ts');
