import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseConstantsFile, type ConstantsFile } from '@quietglass/shared/optics/constants-file';

/**
 * The published optical constants that ship with the product (backend/assets/optical-constants,
 * public domain): the demo shop's starting library and outside check values for the tests.
 */
const LIBRARY_DIR = new URL('../../assets/optical-constants/', import.meta.url);

/** One file of the published library, as index.json lists it. */
export interface LibraryEntry {
  group: 'film' | 'metal' | 'substrate';
  material: string;
  /** What kind of sample was measured, e.g. "ion-assisted e-beam film". */
  kind: string;
  /** Path below the library folder, e.g. "film/sio2--gao.yml". */
  file: string;
  reference: string;
  doi: string | null;
}

export function libraryIndex(): LibraryEntry[] {
  return JSON.parse(fs.readFileSync(new URL('index.json', LIBRARY_DIR), 'utf8')) as LibraryEntry[];
}

/** A library file's text and what it holds. */
export function readLibraryFile(file: string): { text: string; parsed: ConstantsFile; fileName: string } {
  if (!/^(film|metal|substrate)\/[a-z0-9-]+\.yml$/.test(file)) {
    throw new Error(`not a library file: ${file}`);
  }
  const text = fs.readFileSync(fileURLToPath(new URL(file, LIBRARY_DIR)), 'utf8');
  return { text, parsed: parseConstantsFile(text), fileName: file.slice(file.indexOf('/') + 1) };
}
