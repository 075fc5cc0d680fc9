/// <reference types="node" />
/*
 * The optimisers run in the browser preview as well as in the backend worker: like the optics core
 * they must not reach for Node-only modules or globals (the worker-thread splitter is in src/node/).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const here = dirname(fileURLToPath(import.meta.url));
const sources = readdirSync(here).filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts'));

describe('optimisation code', () => {
  it('has source files to check', () => {
    expect(sources).toEqual(
      expect.arrayContaining(['merit.ts', 'fit.ts', 'needle.ts', 'yield.ts', 'random.ts']),
    );
  });

  it.each(sources)('%s imports only the engine’s own modules and uses no Node globals', (file) => {
    const source = readFileSync(join(here, file), 'utf8');
    const imports = [...source.matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map(
      (m) => m[1],
    );
    for (const spec of imports) {
      expect(spec.startsWith('./') || spec.startsWith('../optics/')).toBe(true);
    }
    expect(source).not.toMatch(/\b(process\.|Buffer\b|require\(|__dirname|reference types="node")/);
  });
});
