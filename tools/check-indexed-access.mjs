#!/usr/bin/env node
// Type-checks the shared workspace with `noUncheckedIndexedAccess` on, except in the numeric
// kernels listed below. There an index is in range by construction of the loop (typed arrays of
// known size, millions of lookups a second), and a check per lookup would only add noise; their
// tests cover the ranges. Everything else in shared — parsers, run sheets, masks, tests — must
// treat `items[i]` as possibly missing. (The backend, frontend and tools workspaces have the
// option on in their own tsconfig; they see shared through its built declarations.)
import path from 'node:path';
import ts from 'typescript';

const SHARED = path.resolve(import.meta.dirname, '..', 'shared');

/** Hot numeric loops, relative to shared/src. */
const KERNELS = new Set([
  'optics/batch.ts',
  'optics/colour.ts',
  'optics/derivatives.ts',
  'optics/dispersion.ts',
  'optics/fastmath.ts',
  'optics/field.ts',
  'optics/matrix.ts',
  'optimise/fit.ts',
  'optimise/fit-uncertainty.ts',
  'optimise/merit.ts',
  'optimise/needle.ts',
  'optimise/yield.ts',
]);

const parsed = ts.getParsedCommandLineOfConfigFile(
  path.join(SHARED, 'tsconfig.json'),
  { noUncheckedIndexedAccess: true, noEmit: true },
  {
    ...ts.sys,
    onUnRecoverableConfigFileDiagnostic: (d) => {
      throw new Error(ts.flattenDiagnosticMessageText(d.messageText, '\n'));
    },
  },
);
if (!parsed) throw new Error('shared/tsconfig.json could not be read');

const program = ts.createProgram({ rootNames: parsed.fileNames, options: parsed.options });
const src = path.join(SHARED, 'src') + path.sep;
const diagnostics = program.getSourceFiles().flatMap((file) => {
  const name = path.resolve(file.fileName);
  if (!name.startsWith(src)) return [];
  if (KERNELS.has(path.relative(src, name).split(path.sep).join('/'))) return [];
  return program.getSemanticDiagnostics(file);
});

if (diagnostics.length > 0) {
  const host = {
    getCanonicalFileName: (f) => f,
    getCurrentDirectory: () => SHARED,
    getNewLine: () => '\n',
  };
  process.stderr.write(ts.formatDiagnostics(diagnostics, host));
  process.stderr.write(
    `\n${diagnostics.length} error(s) with noUncheckedIndexedAccess outside the numeric kernels of shared.\n`,
  );
  process.exit(1);
}
