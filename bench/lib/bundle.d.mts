export function staticImports(code: string): string[];
export function measureInitialJs(webRoot: string): {
  files: { file: string; bytes: number; gzip: number }[];
  bytes: number;
  gzip: number;
  css: { bytes: number; gzip: number };
};
