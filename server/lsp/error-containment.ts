/**
 * No request may crash the server or leave it silent. Every provider the server registers is wrapped so that an
 * internal error is logged (to the client's log through the connection, or stderr without one) and answered with
 * an empty result. Cancellation is not an error: it passes through, and Langium answers "request cancelled".
 */
import { isOperationCancelled } from 'langium';
import { ResponseError, type Connection } from 'vscode-languageserver';

/** Where the server writes what went wrong. */
export interface ServerLog {
  error(message: string): void;
  warn(message: string): void;
  info(message: string): void;
}

/** Logs to the client when there is a connection (never to stdout, which may carry the protocol). */
export function createServerLog(connection: Connection | undefined): ServerLog {
  if (connection !== undefined) {
    return {
      error: (message) => connection.console.error(message),
      warn: (message) => connection.console.warn(message),
      info: (message) => connection.console.info(message),
    };
  }
  return {
    error: (message) => process.stderr.write(`[runnel] error: ${message}\n`),
    warn: (message) => process.stderr.write(`[runnel] warning: ${message}\n`),
    info: () => undefined,
  };
}

/** "TypeError: x is undefined\n    at ..." for the log. */
export function describeFault(error: unknown): string {
  if (error instanceof Error) return error.stack ?? `${error.name}: ${error.message}`;
  return String(error);
}

/**
 * Runs `work`; on an internal error logs it with `what` and returns `empty`. Works for plain and async results.
 * Cancellation is rethrown so the request is answered as cancelled, and so is a ResponseError: that is a deliberate
 * answer for the user (e.g. "not a valid name"), not a fault.
 */
export function contained<T>(log: ServerLog, what: string, empty: T, work: () => T | Promise<T>): T | Promise<T> {
  const fail = (error: unknown): T => {
    if (isOperationCancelled(error) || error instanceof ResponseError) throw error;
    log.error(`Runnel: ${what} failed; answering with an empty result. ${describeFault(error)}`);
    return empty;
  };
  try {
    const result = work();
    return result instanceof Promise ? result.catch(fail) : result;
  } catch (error) {
    return fail(error);
  }
}

/**
 * Wraps every method named in `empties` of a provider: each call is `contained`, answering the given empty result
 * on an internal error. Other members pass through unchanged.
 */
export function containProvider<P extends object>(provider: P, log: ServerLog, name: string, empties: Partial<Record<keyof P, unknown>>): P {
  return new Proxy(provider, {
    get(target, property, receiver) {
      const value: unknown = Reflect.get(target, property, receiver);
      if (typeof value !== 'function' || typeof property !== 'string' || !Object.prototype.hasOwnProperty.call(empties, property)) return value;
      const empty = empties[property as keyof P];
      const method = value as (...args: unknown[]) => unknown;
      return (...args: unknown[]) => contained(log, `${name}.${property}`, empty, () => method.apply(target, args));
    },
  });
}

/** Last line of defence: an exception nobody caught is logged; the process keeps serving. */
export function guardProcess(log: ServerLog): void {
  process.on('uncaughtException', (error) => log.error(`Runnel: uncaught exception (the server continues). ${describeFault(error)}`));
  process.on('unhandledRejection', (reason) => {
    if (isOperationCancelled(reason)) return;
    log.error(`Runnel: unhandled rejection (the server continues). ${describeFault(reason)}`);
  });
}
