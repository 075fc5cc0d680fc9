/// <reference types="node" />
/*
 * The optics core runs in the browser preview as well as in the backend worker: it must not reach
 * for Node-only modules or globals. Node-only code lives in src/node/.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { required } from '../checked.js';

const here = dirname(fileURLToPath(import.meta.url));
const coreFiles = [
  ...readdirSync(here).filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts')),
  ...readdirSync(join(here, 'data')).map((f) => join('data', f)),
];

describe('optics core', () => {
  it('has source files to check', () => {
    expect(coreFiles).toContain('matrix.ts');
    expect(coreFiles.length).toBeGreaterThan(10);
  });

  it.each(coreFiles)('%s imports only relative modules and complex.js, and uses no Node globals', (file) => {
    const source = readFileSync(join(here, file), 'utf8');
    const imports = [...source.matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map((m) =>
      required(m[1], 'import specifier'),
    );
    for (const spec of imports) expect(spec.startsWith('.') || spec === 'complex.js').toBe(true);
    expect(source).not.toMatch(/\b(process\.|Buffer\b|require\(|__dirname|reference types="node")/);
  });
});
