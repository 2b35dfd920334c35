// Building located findings: JSON pointers into the file, formatted numbers. Pure.
import type { Finding, Severity, SourceMap } from '../parse.ts';

/** A JSON pointer from path segments: pointer('flour', 'bread flour') → "/flour/bread flour". */
export function pointer(...segments: (string | number)[]): string {
  return segments.map((s) => `/${String(s).replace(/~/g, '~0').replace(/\//g, '~1')}`).join('');
}

export class FindingList {
  readonly findings: Finding[] = [];
  constructor(
    readonly file: string,
    private readonly source: SourceMap | null,
  ) {}

  add(severity: Severity, at: string, message: string, which: 'key' | 'value' = 'value'): void {
    let line = 1;
    let col = 1;
    if (this.source) {
      try {
        ({ line, col } = this.source.locate(at, which));
      } catch {
        // A position is a convenience; the finding itself must not be lost.
      }
    }
    this.findings.push({ file: this.file, line, col, severity, message, pointer: at });
  }
  error(at: string, message: string, which: 'key' | 'value' = 'value'): void {
    this.add('error', at, message, which);
  }
  warning(at: string, message: string, which: 'key' | 'value' = 'value'): void {
    this.add('warning', at, message, which);
  }
}

/** 2.2 → "2.2 %", 0.030000000004 → "0.03 %". */
export function pct(p: number): string {
  if (!Number.isFinite(p)) return `${p} %`;
  return `${Number(p.toFixed(p !== 0 && Math.abs(p) < 1 ? 3 : 2))} %`;
}

/** Grams for a message: one decimal. */
export function grams(g: number): string {
  return `${Number(g.toFixed(1))} g`;
}

export function quote(s: string): string {
  return JSON.stringify(s);
}

export function finite(n: unknown): n is number {
  return typeof n === 'number' && Number.isFinite(n);
}
