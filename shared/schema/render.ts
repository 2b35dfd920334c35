// The committed JSON Schema text for each file kind, rendered from shapes.ts. Pure.
import { SCHEMAS, type SchemaKind } from './shapes.ts';

export function renderJsonSchemas(): Record<SchemaKind, string> {
  const out = {} as Record<SchemaKind, string>;
  for (const [kind, schema] of Object.entries(SCHEMAS) as [SchemaKind, object][]) {
    // JSON.stringify drops TypeBox's symbol keys, leaving plain JSON Schema.
    const plain = JSON.parse(JSON.stringify(schema)) as Record<string, unknown>;
    out[kind] = `${JSON.stringify({ $schema: 'http://json-schema.org/draft-07/schema#', ...plain }, null, 2)}\n`;
  }
  return out;
}
