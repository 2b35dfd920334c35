export function generateCatalogYaml(): string;
export function generateFormulaYaml(index: number, variant?: number, id?: string): string;
export function generatePlanYaml(date: string, ids: string[]): string;
export function writeGeneratedFolder(dir: string, count: number, opts?: { plan?: boolean; variant?: number }): string[];
