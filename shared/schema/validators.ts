// The ajv validators of the three file schemas. They are compiled ahead of time by
// `npm run schema` into validators.generated.ts (committed), so checking a file runs no ajv
// compiler and no TypeBox, and the CLI, the server and the tests all run the same code.
import type { ValidateFunction } from 'ajv';
import type { SchemaKind } from './shapes.ts';
import * as generated from './validators.generated.ts';

export function validatorFor(kind: SchemaKind): ValidateFunction {
  return (generated as unknown as Record<SchemaKind, ValidateFunction>)[kind];
}
