// Types of .scripts/bundle-options.mjs for the TypeScript tests and benchmarks that import it.
import type { BuildOptions } from 'esbuild';
export declare const IMPORT_META_URL_SHIM: string;
export declare const NODE_BUNDLE_OPTIONS: Readonly<BuildOptions>;
export declare const CLI_BANNER: Readonly<{ js: string }>;
export declare const CLI_BUNDLE_FILE: string;
export declare const CODE_CACHE_SUFFIX: string;
export declare const SERVER_BUNDLE_FILE: string;
