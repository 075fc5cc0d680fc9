// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import fs from 'node:fs';
import globals from 'globals';

/**
 * Frontend features stay apart: a feature imports shared code (lib, components, app) but never
 * another feature. One block per feature and folder depth, since imports are relative.
 */
const FEATURES = fs
  .readdirSync(new URL('./frontend/src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const featureBoundaries = FEATURES.flatMap((feature) =>
  [0, 1, 2].map((depth) => ({
    files: [`frontend/src/features/${feature}/${'*/'.repeat(depth)}*.{ts,tsx}`],
    ignores: ['**/__tests__/**'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: `^${'\\.\\./'.repeat(depth + 1)}(?!${feature}/)[^./][^/]*/`,
              message: `A feature does not import another feature; move what both need to lib/ or components/.`,
            },
          ],
        },
      ],
    },
  })),
);

export default tseslint.config(
  {
    ignores: ['**/dist/**', '**/node_modules/**', '.data/**', '**/coverage/**', 'frontend/public/**'],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  // Type-aware rules on every TypeScript file, with the types of the workspace that owns it.
  ...tseslint.configs.recommendedTypeCheckedOnly.map((config) => ({
    ...config,
    files: ['**/*.{ts,tsx,mts}'],
  })),
  {
    files: ['**/*.{ts,tsx,mts}'],
    languageOptions: {
      parserOptions: {
        projectService: { allowDefaultProject: ['frontend/vite.config.ts', 'shared/vitest.config.ts'] },
        tsconfigRootDir: import.meta.dirname,
      },
    },
    rules: {
      // JSX handlers and react-hook-form's handleSubmit take promise-returning functions by design.
      '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { attributes: false } }],
    },
  },
  ...featureBoundaries,
  {
    // A backend module reaches other modules' tables only through their services: outside entity
    // files (relations) and the demo seed, another module's entity is imported as a type only.
    files: ['backend/src/**/*.ts'],
    ignores: [
      'backend/src/**/*.entity.ts',
      'backend/src/database/**',
      'backend/src/migrations/**',
      '**/*.spec.ts',
    ],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '^(\\.\\./)+[a-z-]+/[a-z-]+\\.entity\\.js$',
              allowTypeImports: true,
              message:
                "Another module's entity is a type here; read and write its records through its service.",
            },
          ],
        },
      ],
    },
  },
  {
    // Tests read untyped HTTP bodies and DOM queries and assert on them: the any-flow rules would
    // only ask for casts there. Production code keeps them.
    files: [
      'backend/test/**',
      'tools/e2e/**',
      '**/*.spec.ts',
      '**/*.test.{ts,tsx}',
      '**/__tests__/**',
      'frontend/src/test/**',
    ],
    rules: {
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-return': 'off',
      '@typescript-eslint/unbound-method': 'off',
      '@typescript-eslint/no-unnecessary-type-assertion': 'off',
      '@typescript-eslint/require-await': 'off',
    },
  },
  {
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: { ...globals.node },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': 'off',
      eqeqeq: ['error', 'always'],
      'no-console': 'off',
    },
  },
  {
    files: ['frontend/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    languageOptions: { globals: { ...globals.browser } },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  {
    files: ['shared/src/**/*.ts'],
    languageOptions: { globals: { ...globals['shared-node-browser'] } },
  },
);
