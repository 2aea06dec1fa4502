/**
 * Packages that only some runs need, loaded on their first use instead of at start-up: a `passes`
 * or `resets` run on element sets never reads OMM XML, writes CSV, draws a chart or asks for the
 * Moon, and importing those packages up front cost every such run tens of milliseconds.
 * Node's `require` loads them synchronously (CommonJS, or an ES module on Node ≥ 20.19), so their
 * callers stay synchronous. Types come from `typeof import(...)`, which loads nothing.
 */
import { createRequire } from 'node:module';

const requireFromHere = createRequire(import.meta.url);

/** A getter that loads the package `specifier` the first time it is called, then returns it. */
export function lazyPackage<T>(specifier: string): () => T {
  let loaded: T | undefined;
  return () => (loaded ??= requireFromHere(specifier) as T);
}
