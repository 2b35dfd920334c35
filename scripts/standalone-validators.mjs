// Generates the schema validators as standalone JavaScript (ajv's standalone code) from the
// committed JSON Schemas in shared/schema/. The CLI bundle uses this code in place of
// shared/schema/validators.ts (see scripts/build.mjs), so `panform` starts without loading the
// ajv compiler and TypeBox and without compiling the schemas on every run.
// tests/reliability/standalone-validators.test.ts checks that both give the same findings.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Ajv } from 'ajv';
import standaloneCode from 'ajv/dist/standalone/index.js';

/** Must match AJV_OPTIONS in shared/schema/validators.ts (the test above compares the results). */
export const AJV_OPTIONS = { allErrors: true, strict: false, allowUnionTypes: true };
export const KINDS = ['formula', 'catalog', 'plan'];

/** ES module source exporting `validatorFor(kind)`, like shared/schema/validators.ts. */
export function generateValidatorsModule(schemaDir = join(process.cwd(), 'shared', 'schema')) {
  const ajv = new Ajv({ ...AJV_OPTIONS, code: { source: true, esm: true } });
  const refs = {};
  for (const kind of KINDS) {
    const schema = JSON.parse(readFileSync(join(schemaDir, `${kind}.schema.json`), 'utf8'));
    const id = schema.$id ?? kind;
    ajv.addSchema(schema, schema.$id ? undefined : kind);
    refs[kind] = id;
  }
  let code = standaloneCode(ajv, refs);
  // ajv's ESM output still reaches its runtime helpers with require(); an ES module bundle has
  // no require, so turn each into an import.
  const imports = [];
  code = code.replace(/require\("(ajv\/dist\/runtime\/[a-z0-9]+)"\)/gi, (_, path) => {
    const name = `runtime${imports.length}`;
    imports.push(`import ${name} from "${path}.js";`);
    return name;
  });
  if (/\brequire\(/.test(code)) throw new Error('standalone validators: an unexpected require() is left in the generated code');
  return `${imports.join('\n')}\n${code}\nconst validators = { ${KINDS.join(', ')} };\nexport function validatorFor(kind) {\n  return validators[kind];\n}\n`;
}
