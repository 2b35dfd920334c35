import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderJsonSchemas } from '../../shared/schema/render.ts';
import { renderValidatorsModule } from '../../scripts/schema-validators.mjs';

const committed = (name: string) => readFileSync(new URL(`../../shared/schema/${name}`, import.meta.url), 'utf8');

describe('npm run schema', () => {
  it.each(Object.entries(renderJsonSchemas()))('the committed %s.schema.json matches shapes.ts (run `npm run schema`)', (kind, text) => {
    expect(committed(`${kind}.schema.json`)).toBe(text);
  });

  it('the committed validators.generated.ts matches the schemas (run `npm run schema`)', () => {
    expect(committed('validators.generated.ts')).toBe(renderValidatorsModule(renderJsonSchemas()));
  });
});
