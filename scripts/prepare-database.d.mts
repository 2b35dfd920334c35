export declare const SEED_DIR: string;
export declare function prepareDatabaseSeed(dir?: string): Promise<void>;
