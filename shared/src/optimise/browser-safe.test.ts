/// <reference types="node" />
/*
 * The optimisers run in the browser preview as well as in the backend worker: like the optics core
 * they must not reach for Node-only modules or globals (the worker-thread splitter is in src/node/).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { required } from '../checked.js';

const here = dirname(fileURLToPath(import.meta.url));
const NODE_ONLY = /\b(process\.|Buffer\b|require\(|__dirname|reference types="node")/;
const sources = readdirSync(here).filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts'));

describe('optimisation code', () => {
  it('has source files to check', () => {
    expect(sources).toEqual(
      expect.arrayContaining(['merit.ts', 'fit.ts', 'needle.ts', 'yield.ts', 'random.ts']),
    );
  });

  it.each(sources)('%s imports only the engine’s own modules and uses no Node globals', (file) => {
    const source = readFileSync(join(here, file), 'utf8');
    const imports = [...source.matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map((m) =>
      required(m[1], 'import specifier'),
    );
    for (const spec of imports) {
      // Own folder, the optics core, or a shared rule module one level up (itself checked below).
      const sharedRule = /^\.\.\/[a-z-]+\.js$/.test(spec);
      expect(
        spec.startsWith('./') || spec.startsWith('../optics/') || sharedRule,
        `${file} imports ${spec}`,
      ).toBe(true);
      if (sharedRule) {
        const rule = readFileSync(join(here, spec.replace(/\.js$/, '.ts')), 'utf8');
        expect(rule, `${spec} uses a Node global`).not.toMatch(NODE_ONLY);
        expect(rule, `${spec} imports a package`).not.toMatch(/from\s+['"][^.'"][^'"]*['"]/);
      }
    }
    expect(source).not.toMatch(NODE_ONLY);
  });
});
