/*
 * Object.groupBy / Map.groupBy polyfill for Node 20.
 *
 * Why: Langium 4.4 depends on chevrotain 13, which calls Object.groupBy (added in Node 21). Runnel targets
 * Node 20 and keeps Langium 4.4 because it shares vscode-languageserver 10 / LSP 3.18 with the client;
 * Langium 4.1 would pull in a second, older LSP stack. This file is loaded first by the CLI bundle, the
 * server bundle, the Langium generator and vitest's setup. It does nothing on Node 21+.
 * Semantics follow the ECMAScript 2024 specification (group into a null-prototype object / a Map).
 */
'use strict';
if (typeof Object.groupBy !== 'function') {
  Object.defineProperty(Object, 'groupBy', {
    configurable: true,
    writable: true,
    value: function groupBy(items, keySelector) {
      const groups = Object.create(null);
      let index = 0;
      for (const item of items) {
        const key = keySelector(item, index++);
        const propertyKey = typeof key === 'symbol' ? key : String(key);
        (groups[propertyKey] ??= []).push(item);
      }
      return groups;
    },
  });
}
if (typeof Map.groupBy !== 'function') {
  Object.defineProperty(Map, 'groupBy', {
    configurable: true,
    writable: true,
    value: function groupBy(items, keySelector) {
      const groups = new Map();
      let index = 0;
      for (const item of items) {
        const key = keySelector(item, index++);
        const group = groups.get(key);
        if (group) group.push(item);
        else groups.set(key, [item]);
      }
      return groups;
    },
  });
}
