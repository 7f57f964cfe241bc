// Entry of the worker thread that runs the document harness (see bounded-harness.ts): lets the thread load the
// TypeScript sources through tsx, as vitest does for the test itself, then starts the harness loop.
import { register } from 'tsx/esm/api';

register();
await import('./harness-worker.ts');
