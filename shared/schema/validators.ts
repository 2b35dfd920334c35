// The ajv validators of the three file schemas, compiled on first use. The CLI bundle replaces
// this module with standalone code generated at build time from the committed JSON Schemas
// (scripts/standalone-validators.mjs, wired in scripts/build.mjs), so `panform` does not load
// the ajv compiler and TypeBox, nor compile the schemas, on every start. Both must give the same
// errors: tests/reliability/standalone-validators.test.ts compares them.
import { Ajv, type ValidateFunction } from 'ajv';
import { SCHEMAS, type SchemaKind } from './shapes.ts';

/** Keep equal to AJV_OPTIONS in scripts/standalone-validators.mjs. */
export const AJV_OPTIONS = { allErrors: true, strict: false, allowUnionTypes: true } as const;

let ajv: Ajv | undefined;
const validators = new Map<SchemaKind, ValidateFunction>();

export function validatorFor(kind: SchemaKind): ValidateFunction {
  let v = validators.get(kind);
  if (!v) {
    ajv ??= new Ajv({ ...AJV_OPTIONS });
    v = ajv.compile(SCHEMAS[kind]);
    validators.set(kind, v);
  }
  return v;
}
