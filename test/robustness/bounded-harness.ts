/**
 * The document harness (document-harness.ts) behind a watchdog: it runs in a worker thread, and a check that has not
 * answered within WATCHDOG_MS is a problem of its own ("did not finish"); the thread is then stopped and a fresh one
 * takes its place with the same files. Without this a parser, validator or solver that loops for ever would hang
 * the test run instead of failing it with the text that did it.
 */
import { Worker } from 'node:worker_threads';
import type { Diagnostic } from 'vscode-languageserver';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { largestNumberWritten, type CheckOptions } from './document-harness.js';

/** A check still running after this is stopped and reported (the harness's own time bound is lower). */
export const WATCHDOG_MS = 8_000;
/** Starting a worker and building its workspace can take a while on a loaded machine. */
const START_BOUND_MS = 60_000;

export type HarnessRequest =
  | { readonly id: number; readonly kind: 'create'; readonly files: Readonly<Record<string, string>> }
  | { readonly id: number; readonly kind: 'put'; readonly name: string; readonly text: string }
  | { readonly id: number; readonly kind: 'restore'; readonly name: string }
  | { readonly id: number; readonly kind: 'check'; readonly name: string; readonly text: string; readonly options: CheckOptions };

/** The outcome of a check as it crosses the thread boundary (plain data). */
export interface PlainOutcome {
  readonly problems: string[];
  readonly analysis: DesignAnalysis;
  readonly diagnostics: readonly Diagnostic[];
  readonly formatted: string | undefined;
  readonly elapsedMs: number;
}

export type HarnessReply =
  | { readonly id: number; readonly kind: 'created'; readonly editorFeaturesNote: string }
  | { readonly id: number; readonly kind: 'done' }
  | { readonly id: number; readonly kind: 'checked'; readonly outcome: PlainOutcome }
  | { readonly id: number; readonly kind: 'failed'; readonly message: string };

type RequestBody = HarnessRequest extends infer R ? (R extends HarnessRequest ? Omit<R, 'id'> : never) : never;

export class BoundedHarness {
  private worker: Worker;
  private nextId = 1;
  private readonly waiting = new Map<number, (reply: HarnessReply) => void>();
  /** The files as they are now, to rebuild a replacement worker. */
  private readonly files: Record<string, string>;
  /** Why the editor checks (hints, hover, formatting) were skipped, or '' when they ran. */
  editorFeaturesNote = '';
  /** Checks stopped by the watchdog. */
  stopped = 0;

  private constructor(files: Readonly<Record<string, string>>) {
    this.files = { ...files };
    this.worker = this.startWorker();
  }

  static async create(files: Readonly<Record<string, string>>): Promise<BoundedHarness> {
    const harness = new BoundedHarness(files);
    await harness.initialise();
    return harness;
  }

  async put(name: string, text: string): Promise<void> {
    this.files[name] = text;
    expectDone(await this.send({ kind: 'put', name, text }, START_BOUND_MS), `putting ${name}`);
  }

  async restore(name: string): Promise<void> {
    expectDone(await this.send({ kind: 'restore', name }, START_BOUND_MS), `restoring ${name}`);
  }

  /** Runs every check on the text; a check that does not finish within WATCHDOG_MS is reported as a problem. */
  async check(name: string, text: string, options: CheckOptions = {}): Promise<PlainOutcome> {
    const reply = await this.send({ kind: 'check', name, text, options }, WATCHDOG_MS);
    if (reply === undefined) {
      this.stopped++;
      await this.replaceWorker();
      return { problems: [`did not finish within ${WATCHDOG_MS} ms (stopped); largest number written: ${largestNumberWritten(text)}`], analysis: undefined as unknown as DesignAnalysis, diagnostics: [], formatted: undefined, elapsedMs: WATCHDOG_MS };
    }
    if (reply.kind === 'failed') return { problems: [`the harness failed: ${reply.message}`], analysis: undefined as unknown as DesignAnalysis, diagnostics: [], formatted: undefined, elapsedMs: 0 };
    if (reply.kind !== 'checked') throw new Error(`internal: unexpected reply ${reply.kind}`);
    return reply.outcome;
  }

  async close(): Promise<void> {
    await this.worker.terminate();
  }

  private startWorker(): Worker {
    const worker = new Worker(new URL('./harness-worker-entry.mjs', import.meta.url));
    worker.on('message', (reply: HarnessReply) => {
      const resolve = this.waiting.get(reply.id);
      this.waiting.delete(reply.id);
      resolve?.(reply);
    });
    worker.on('error', (error) => {
      for (const [id, resolve] of this.waiting) resolve({ id, kind: 'failed', message: `the worker failed: ${error.stack ?? error.message}` });
      this.waiting.clear();
    });
    worker.unref();
    return worker;
  }

  private async initialise(): Promise<void> {
    const reply = await this.send({ kind: 'create', files: this.files }, START_BOUND_MS);
    if (reply?.kind !== 'created') throw new Error(`the harness worker did not start: ${reply?.kind === 'failed' ? reply.message : 'no answer'}`);
    this.editorFeaturesNote = reply.editorFeaturesNote;
  }

  private async replaceWorker(): Promise<void> {
    const old = this.worker;
    this.worker = this.startWorker();
    await old.terminate();
    await this.initialise();
  }

  /** Sends a request; undefined when no answer came within `boundMs`. */
  private send(body: RequestBody, boundMs: number): Promise<HarnessReply | undefined> {
    const id = this.nextId++;
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.waiting.delete(id);
        resolve(undefined);
      }, boundMs);
      this.waiting.set(id, (reply) => {
        clearTimeout(timer);
        resolve(reply);
      });
      this.worker.postMessage({ ...body, id });
    });
  }
}

function expectDone(reply: HarnessReply | undefined, what: string): void {
  if (reply === undefined) throw new Error(`the harness worker did not answer within ${START_BOUND_MS} ms when ${what}`);
  if (reply.kind === 'failed') throw new Error(`the harness worker failed when ${what}: ${reply.message}`);
}
