// Types of scripts/precompress.mjs (for tests that call it).
export declare const COMPRESSIBLE: RegExp;
export declare function copyPlotly(distDir: string): string;
export declare function precompress(distDir: string): Promise<{ files: number; bytes: number }>;
