import type { Plugin } from 'esbuild';
export declare const EXTERNAL: string[];
export declare const QUICK_COMMANDS: string[];
export declare function buildCliBundle(opts: { root?: string; outdir: string; logLevel?: 'silent' | 'warning' | 'error'; plugins?: Plugin[] }): Promise<void>;
