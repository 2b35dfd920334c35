// The files `panform new` writes into a new formulas repository: a starter catalog, one sample
// formula, a sample plan, the pre-commit hook, an example CI script, editor settings and a short
// README for the bakery. Pure text; cli/commands/new.ts checks and writes it.

/** The sample formula's id (and file name). */
export const SAMPLE_FORMULA = 'house-loaf';

/** Where the copies of Panform's schemas go, for editors (the repository's own copy, shared by the team). */
export const SCHEMAS_FOLDER = 'schemas';
export const SCHEMA_FILES = ['formula.schema.json', 'catalog.schema.json', 'plan.schema.json'] as const;

const CHECK_AGAINST = 'from memory, check against FoodData Central';

export const CATALOG_YAML = `# yaml-language-server: $schema=${SCHEMAS_FOLDER}/catalog.schema.json
#
# The bakery's ingredient catalog: the names formulas use, with what Panform needs to know of each.
# A starter list written by \`panform new\`: rename, add and remove entries to match what the
# bakery buys (a formula may use only names listed here).
#
# \`water\` is the water content in percent of the ingredient's weight; effective hydration adds
# it for every line that is not flour. Flour counts as dry in baker's percent, so the flours say
# 0 % and give their own moisture in \`water_source\` for reference. Each value names its source:
# the USDA National Nutrient Database for Standard Reference, Release 28 (SR28, also served by
# USDA FoodData Central as "SR Legacy"), by its NDB number. The figures were written down
# ${CHECK_AGAINST}, or against your supplier's specification, before you rely on them.
#
# Allergens are an aid, not a label: check every declaration against your supplier's
# specification and your local food-labelling rules.

# ---- flours -------------------------------------------------------------------------------------
bread flour:
  kind: flour
  water: 0 %
  water_source: "flour counts as dry; its own moisture is about 13.4 g per 100 g (USDA SR28 NDB 20481, Wheat flour, white, bread, enriched; ${CHECK_AGAINST})"
  allergens: [wheat]
  label: wheat flour
all-purpose flour:
  kind: flour
  water: 0 %
  water_source: "flour counts as dry; its own moisture is about 11.9 g per 100 g (USDA SR28 NDB 20081, Wheat flour, white, all-purpose, enriched, bleached; ${CHECK_AGAINST})"
  allergens: [wheat]
  label: wheat flour
wholemeal flour:
  kind: flour
  water: 0 %
  water_source: "flour counts as dry; its own moisture is about 10.7 g per 100 g (USDA SR28 NDB 20080, Wheat flour, whole-grain; ${CHECK_AGAINST})"
  allergens: [wheat]
  label: wholemeal wheat flour
  labels: { us: whole wheat flour }
rye flour:
  kind: flour
  water: 0 %
  water_source: "flour counts as dry; its own moisture is about 10 to 11 g per 100 g (USDA SR28 NDB 20063, Rye flour, dark; ${CHECK_AGAINST})"
  allergens: [rye]
  label: wholemeal rye flour
  labels: { us: whole rye flour }

# ---- water and salt -----------------------------------------------------------------------------
water:
  kind: water
  water: 100 %
  water_source: "water, by definition"
  label: water
fine salt:
  kind: salt
  water: 0 %
  water_source: "about 0.2 g per 100 g, counted as none (USDA SR28 NDB 02047, Salt, table; ${CHECK_AGAINST})"
  label: salt

# ---- yeasts -------------------------------------------------------------------------------------
fresh yeast:
  kind: yeast
  yeast: fresh
  water: 69 %
  water_source: "USDA SR28 NDB 18374, Leavening agents, yeast, baker's, compressed (${CHECK_AGAINST})"
  label: yeast
  note: Keep at 2-6 °C; use within its date.
instant yeast:
  kind: yeast
  yeast: instant
  water: 5.1 %
  water_source: "USDA SR28 NDB 18375, Leavening agents, yeast, baker's, active dry (${CHECK_AGAINST})"
  label: yeast

# ---- cultures -----------------------------------------------------------------------------------
# A culture is written in a levain build in percent of the build's flour; its flour and water
# count as flour and water of the build, split by its hydration.
mature levain:
  kind: culture
  hydration: 100 %
  fed_with: bread flour
  water_source: "from its hydration: at 100 % it is half water, half flour"
  allergens: [wheat]
  label: wheat flour
  note: The house culture, fed with bread flour and water in equal weights.
`;

export const SAMPLE_FORMULA_YAML = `# yaml-language-server: $schema=${SCHEMAS_FOLDER}/formula.schema.json
# A sample to start from, written by \`panform new\`: change it, or delete it once the bakery's
# own formulas are in. Percentages are baker's percent (the flours make 100).
id: ${SAMPLE_FORMULA}
title: House loaf
status: active
category: sourdough
description: A levain loaf of white and wholemeal flour, mixed and baked the same night.
tags: [levain, sample]
yield: { pieces: 10, piece: 850 g }
loss: 2 %
dough_temperature: 25 °C
flour:
  bread flour: 90
  wholemeal flour: 10
ingredients:
  water: 72
  fine salt: 2
preferments:
  - name: levain
    kind: levain
    share: 15 %
    ingredients:
      bread flour: 100
      water: 100
      mature levain: 20      # the seed: its flour and water count inside the two lines above
    ripen: { hours: 8-10, temperature: 24 °C }
    note: Build it in the afternoon before the night's mix.
process:
  - { step: mix, minutes: 8 }
  - { step: bulk, hours: 3, temperature: 25 °C, folds: { count: 3, every: 30 } }
  - { step: divide, seconds_per_piece: 8 }
  - { step: preshape, seconds_per_piece: 5 }
  - { step: rest, minutes: 20 }
  - { step: shape, seconds_per_piece: 12, note: into floured baskets }
  - { step: proof, minutes: 75 }
  - { step: bake, per_slot: 4, minutes: 40, temperature: 235 °C, note: "with steam: stand clear of the door as it opens" }
  - { step: cool, minutes: 90 }
`;

export function samplePlanYaml(date: string): string {
  return `# yaml-language-server: $schema=../${SCHEMAS_FOLDER}/plan.schema.json
# A sample night, written by \`panform new\` for the day after the repository was made. The
# room, flour and tap-water temperatures, the mixer and the oven are examples: put in your own.
date: ${date}
ready_by: "07:00"
conditions: { room: 22 °C, flour: 20 °C, tap_water: 12 °C }
mixers:
  - { name: spiral, capacity: 40 kg, minimum: 5 kg, friction: 12 °C, clean_down: 15 }
  - { name: small spiral, capacity: 12 kg, minimum: 2 kg, friction: 10 °C, clean_down: 10 }
ovens:
  - { name: deck oven, decks: 2, slots: 4, heat: 4 °C/min, cool: 2 °C/min, steam: true, fan: false }
bench:
  - { from: "00:00", to: "08:00", people: 2 }
orders:
  - { formula: ${SAMPLE_FORMULA}, pieces: 20, mixer: spiral, due: "07:00", customer: the shop }
notes: Sample plan; copy it for each bake day (plans/YYYY-MM-DD.yaml).
`;
}


export const GITIGNORE = `# Panform's own data when \`panform serve\` or \`panform load\` run here (private to you, never committed)
var/
# Printed sheets
*.pdf
`;

/**
 * The pre-commit hook: checks the files as they will be committed (the index, exported to a
 * private temporary folder), so a broken file cannot be committed even when the working copy was
 * fixed after \`git add\`. Finds panform on PATH, else through git config panform.command (set by
 * \`panform new\` and \`panform git-setup\` to the installation that ran them).
 */
export const PRE_COMMIT_HOOK = `#!/bin/sh
# Panform: refuse a commit whose formulas, catalog or plans have errors.
# It checks the files as they will be committed (what \`git add\` staged), not the working copies.
# Warnings do not stop a commit. Skip the check once with \`git commit --no-verify\`; CI checks
# again on every push.
if command -v panform >/dev/null 2>&1; then
  PANFORM=panform
else
  PANFORM=$(git config --get panform.command)
  if [ -z "$PANFORM" ]; then
    echo "pre-commit: panform is not on PATH and git config has no panform.command." >&2
    echo "  Install Panform (README.md), then run \\\`panform git-setup\\\` in this repository." >&2
    exit 1
  fi
fi
staged=$(mktemp -d "\${TMPDIR:-/tmp}/panform-pre-commit.XXXXXX") || exit 1
trap 'rm -rf "$staged"' EXIT
trap 'exit 1' INT TERM
git checkout-index --all --prefix="$staged/" || exit 1
cd "$staged" || exit 1
echo "pre-commit: panform check (the staged files)"
eval "$PANFORM check ."
`;

export const CI_SCRIPT = `#!/bin/sh
# Example CI step: check every formula, the catalog and the plans on each push.
# Run it from any CI service on a machine with Node.js 20.19 or newer and Panform installed
# (README.md, "Set up a machine"), e.g. as the step "sh ci/check.sh". A file with an error fails
# the run (exit 1) with one line per problem: file:line:col severity message.
#
# To keep the viewer up to date, add a step on the main branch only, on the machine that runs
# \`panform serve\` (or one that reaches its PostgreSQL through DATABASE_URL):
#   panform load --data /srv/panform/data .
set -eu
cd "$(dirname "$0")/.."
if ! command -v panform >/dev/null 2>&1; then
  echo "ci: panform is not installed on this machine; install it first (README.md)" >&2
  exit 2
fi
panform --version
panform check .
`;

export function vscodeSettings(): string {
  const s = (name: string) => `./${SCHEMAS_FOLDER}/${name}`;
  return `${JSON.stringify(
    {
      'yaml.schemas': {
        [s('catalog.schema.json')]: ['ingredients.yaml'],
        [s('plan.schema.json')]: ['plans/*.yaml', 'plans/*.yml'],
        [s('formula.schema.json')]: ['/*.yaml', '/*.yml', '!ingredients.yaml'],
      },
      'files.associations': { '.githooks/*': 'shellscript' },
    },
    null,
    2,
  )}\n`;
}

export function bakeryReadme(o: { title: string; planFile: string }): string {
  return `# ${o.title}

The bakery's dough formulas, kept as YAML files for [Panform](https://panform.example): one file
per formula, the ingredient catalog in \`ingredients.yaml\`, and a plan per bake day in \`plans/\`.

| file | what it is |
|---|---|
| \`ingredients.yaml\` | every ingredient the formulas use, with its water content and where that figure comes from |
| \`${SAMPLE_FORMULA}.yaml\` | a sample formula in baker's percent; change it or delete it |
| \`${o.planFile}\` | a sample night: orders, mixer, oven, bench hours |
| \`schemas/\` | the file formats, for editors (\`.vscode/settings.json\` maps them to the files) |
| \`.githooks/pre-commit\` | refuses a commit with a broken file (runs \`panform check\`) |
| \`ci/check.sh\` | the same check for a CI service, on every push |

## Set up a machine

Needs Node.js 20.19 or newer and Panform installed as a command (\`npm install -g\` of the Panform
package your bakery keeps; \`panform --version\` shows it works). In each clone of this repository,
run once:

\`\`\`sh
panform git-setup     # git diff shows formula figures; commits are checked by .githooks/pre-commit
\`\`\`

## Every day

\`\`\`sh
panform check                                   # every file: schema, units and the baker's arithmetic
panform scale ${SAMPLE_FORMULA} --pieces 30              # one formula at another batch size
panform sheet ${o.planFile}             # tomorrow's batch sheet (--format pdf --out sheet.pdf to print)
git diff                                        # a formula change, with its figures above the YAML
\`\`\`

A new bake day is a copy of a plan with its date and orders changed. A new formula:
\`panform init --dir .\` asks for it, or copy \`${SAMPLE_FORMULA}.yaml\`.

## The viewer

On the machine that serves the team, in a clone of this repository:

\`\`\`sh
panform user add you@bakery.example --role admin    # the first account (asks for a password)
panform serve --formulas .                          # the first start loads these files
\`\`\`

After a change is reviewed and merged, bring it in with \`git pull && panform load\` on that
machine (it hands the load to the running server): the team sees it at once. \`panform load\`
checks every file first and loads nothing when one has an error.

Panform's figures, allergen lists and cautions support, and do not replace, the bakery's own
food-safety and labelling review under local rules.
`;
}
