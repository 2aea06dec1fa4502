/**
 * The real public products in ../shared/realdata (read there, never copied into the repository).
 * A test that needs them uses `realDescribe`, which skips with a visible message when the folder
 * is absent (a fresh clone outside the workplace).
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe } from 'vitest';

/** ../shared/realdata relative to the project root. */
export const REALDATA = resolve(process.cwd(), '../shared/realdata');

/** Path of a file in the real-data folder. */
export function real(path: string): string {
  return resolve(REALDATA, path);
}

/** `describe` when the real files are there; otherwise a skipped block that says why. */
export function realDescribe(name: string, files: string[], body: () => void): void {
  const missing = files.filter((f) => !existsSync(real(f)));
  if (missing.length === 0) {
    describe(name, body);
    return;
  }
  console.warn(`SKIPPED "${name}": real data not found (${missing.map(real).join(', ')}); these checks run only where ../shared/realdata exists`);
  describe.skip(`${name} [skipped: ../shared/realdata absent]`, body);
}
