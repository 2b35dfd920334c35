import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { renderJsonSchemas } from '../../shared/schema/render.ts';

describe('renderJsonSchemas', () => {
  it.each(Object.entries(renderJsonSchemas()))('the committed %s.schema.json matches shapes.ts (run `npm run schema`)', (kind, text) => {
    const committed = readFileSync(new URL(`../../shared/schema/${kind}.schema.json`, import.meta.url), 'utf8');
    expect(committed).toBe(text);
  });
});
