// A test that makes Panform write to console.error or console.warn fails, unless it opts in
// with `allowConsole()`.
import { afterEach, beforeEach, vi } from 'vitest';

let allowed = false;
export function allowConsole(): void {
  allowed = true;
}

beforeEach(() => {
  allowed = false;
  for (const level of ['error', 'warn'] as const) {
    vi.spyOn(console, level).mockImplementation((...args: unknown[]) => {
      if (!allowed) throw new Error(`unexpected console.${level}: ${args.map(String).join(' ')}`);
    });
  }
});
afterEach(() => {
  vi.restoreAllMocks();
});
