// Runs a CommonJS bundle through V8's code cache, so that a start after the first skips compiling it: the `runnel`
// command (dist/runnel.cjs, cli-launcher.ts) and the language server (dist/server.cjs, server-launcher.ts) start
// this way; each launcher is a few lines bundled on its own, the bundle it runs is beside it.
//
// Why: a cold `runnel check` spent about a quarter of its time compiling and loading its 1.5 MB bundle (Langium,
// Chevrotain and the protocol libraries with our code) and more compiling the functions it then ran; the server
// (2 MB) the same before its first diagnostics. Node 22 caches compiled code by itself (module.enableCompileCache);
// Node 20 does not, so the launcher keeps V8's cached data of the bundle in a file beside it, written once at the
// end of a run that had none (the build writes the CLI's by checking a sample: .scripts/build.mjs). Measured by
// `npm run bench -- cold-start`, which also times starts without it.
//
// Safety: V8 accepts cached data made from another source of the same length (it checks the length, not the text;
// tried on Node 20.20: a same-length edit of the bundle then ran the old code). So the file begins with the SHA-256 of
// the bundle it was made from, and data for any other bundle is not used. Data V8 rejects (another Node version or
// flags) is replaced at the end of the run. No cache file, an unreadable or unwritable one: the bundle runs as
// without the launcher. The file lives beside the bundle, where only those who can change the bundle can write.
import { createHash } from 'node:crypto';
import { closeSync, openSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { Script } from 'node:vm';
import { CODE_CACHE_SUFFIX } from '../.scripts/bundle-options.mjs';

const DIGEST_BYTES = 32; // SHA-256

type CommonJsWrapper = (exports: object, require: NodeJS.Require, module: object, filename: string, dirname: string) => void;

/** Runs the CommonJS file `bundlePath` as the main module would, with its code cache when a valid one exists. */
export function runWithCodeCache(bundlePath: string): void {
  const cachePath = `${bundlePath}${CODE_CACHE_SUFFIX}`;
  const bundleBytes = readFileSync(bundlePath);
  const digest = createHash('sha256').update(bundleBytes).digest();
  const cachedData = cachedDataFor(cachePath, digest);
  // Node's CommonJS wrapper, on one line so that line numbers in stack traces and source maps stay the bundle's.
  const source = `(function (exports, require, module, __filename, __dirname) { ${bundleBytes.toString('utf8')}\n})`;
  const script = new Script(source, { filename: bundlePath, ...(cachedData === undefined ? {} : { cachedData }) });
  if (cachedData === undefined || script.cachedDataRejected === true) {
    // At the end of the run the data covers the functions the run compiled, not only the top level.
    process.once('exit', () => writeCodeCache(script, cachePath, digest));
  }
  const bundleModule = { exports: {}, filename: bundlePath, id: '.', loaded: false };
  const run = script.runInThisContext() as CommonJsWrapper;
  run.call(bundleModule.exports, bundleModule.exports, createRequire(bundlePath), bundleModule, bundlePath, dirname(bundlePath));
}

/** The cached data in `cachePath` when it was made from the bundle with this digest; undefined otherwise. */
function cachedDataFor(cachePath: string, digest: Buffer): Buffer | undefined {
  let file: Buffer;
  try {
    file = readFileSync(cachePath);
  } catch {
    return undefined;
  }
  if (file.length <= DIGEST_BYTES || !file.subarray(0, DIGEST_BYTES).equals(digest)) return undefined;
  return file.subarray(DIGEST_BYTES);
}

/** Writes the digest and V8's data through a temporary file, so that a concurrent start never reads half a file. */
function writeCodeCache(script: Script, cachePath: string, digest: Buffer): void {
  const temporary = `${cachePath}.${process.pid}.tmp`;
  try {
    // Open the file before serialising the code, which takes tens of milliseconds: a folder we may not write to
    // costs every run nothing but a failed open.
    const file = openSync(temporary, 'wx');
    try {
      writeFileSync(file, Buffer.concat([digest, script.createCachedData()]));
    } finally {
      closeSync(file);
    }
    renameSync(temporary, cachePath);
  } catch {
    // A folder we may not write to (an installation owned by another user): run without a cache.
    try {
      rmSync(temporary, { force: true });
    } catch {
      // nothing was written
    }
  }
}
