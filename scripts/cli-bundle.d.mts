export declare const EXTERNAL: string[];
export declare function buildCliBundle(opts: { root?: string; outdir: string; logLevel?: 'silent' | 'warning' | 'error' }): Promise<void>;
