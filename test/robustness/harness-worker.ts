/**
 * The worker side of the bounded harness (bounded-harness.ts): a DocumentHarness in its own thread, so a check that
 * never finishes can be stopped from outside. Answers each request with the outcome as plain data.
 */
import '../../language/polyfills/object-group-by.cjs';
import { parentPort } from 'node:worker_threads';
import { DocumentHarness, editorFeaturesNote } from './document-harness.js';
import type { HarnessReply, HarnessRequest } from './bounded-harness.js';

let harness: DocumentHarness | undefined;

async function answer(request: HarnessRequest): Promise<HarnessReply> {
  switch (request.kind) {
    case 'create':
      harness = await DocumentHarness.create(request.files);
      return { id: request.id, kind: 'created', editorFeaturesNote };
    case 'put':
      await ready().put(request.name, request.text);
      return { id: request.id, kind: 'done' };
    case 'restore':
      await ready().restore(request.name);
      return { id: request.id, kind: 'done' };
    case 'check': {
      const outcome = await ready().check(request.name, request.text, request.options);
      return { id: request.id, kind: 'checked', outcome: { problems: outcome.problems, analysis: outcome.analysis, diagnostics: outcome.diagnostics, formatted: outcome.formatted, elapsedMs: outcome.elapsedMs } };
    }
  }
}

function ready(): DocumentHarness {
  if (harness === undefined) throw new Error('internal: the harness worker was not created');
  return harness;
}

parentPort?.on('message', (request: HarnessRequest) => {
  answer(request).then(
    (reply) => parentPort?.postMessage(reply),
    (error: unknown) => parentPort?.postMessage({ id: request.id, kind: 'failed', message: error instanceof Error ? (error.stack ?? error.message) : String(error) } satisfies HarnessReply),
  );
});
