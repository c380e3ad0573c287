// @ts-check
import eslint from '@eslint/js';
import angular from 'angular-eslint';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  {
    ignores: [
      'dist/**',
      'node_modules/**',
      '.angular/**',
      'data/**',
      'tests/artifacts/**',
      'shared/integrate/odex-module.js',
      'storybook-static/**',
    ],
  },
  {
    files: ['**/*.ts'],
    extends: [eslint.configs.recommended, ...tseslint.configs.recommended],
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/no-non-null-assertion': 'off',
      'no-restricted-syntax': [
        'error',
        {
          selector:
            'CallExpression[callee.property.name=/^(skip|todo)$/][callee.object.name=/^(it|test|describe)$/]',
          message: 'A skipped test cannot fail; fix it or delete it.',
        },
      ],
    },
  },
  {
    // Published Runge–Kutta coefficients are kept digit for digit as printed (Hairer, Nørsett &
    // Wanner); the literal rounds to the nearest double exactly as the reference code does.
    files: ['shared/integrate/dop853-*.ts'],
    rules: { 'no-loss-of-precision': 'off' },
  },
  {
    // The engine stays free of Angular, Express and Knex (architecture.md, "Boundaries").
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                '@angular/*',
                'express',
                'knex',
                'better-sqlite3',
                '../server/*',
                '../projects/*',
              ],
              message: '@tropline/core is framework-free.',
            },
          ],
        },
      ],
    },
  },
  {
    // Nobody reaches into the engine's folders by relative path; import '@tropline/core'.
    files: ['server/**/*.ts', 'projects/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [{ group: ['**/shared/*', '**/shared'], message: "Import '@tropline/core'." }],
        },
      ],
    },
  },
  {
    // Browser code never reaches the Node-only entry (piscina, worker_threads).
    files: ['projects/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: '@tropline/core/node', message: 'Node-only; browsers use @tropline/core.' },
          ],
          patterns: [{ group: ['**/shared/*', '**/shared'], message: "Import '@tropline/core'." }],
        },
      ],
    },
  },
  {
    // Browser code of the library, the portal and the elements needs only the contract (schemas,
    // pointers, cautions): the full barrel carries the engine (odex, DOP853, the analyses) and
    // builds every app against all of it. Specs, stories and the testing entry compute with the
    // engine on purpose; the console previews projections in the page and keeps the barrel.
    files: [
      'projects/widgets/src/**/*.ts',
      'projects/elements/**/*.ts',
      'projects/demo-portal/**/*.ts',
    ],
    ignores: ['**/*.spec.ts', '**/*.stories.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: '@tropline/core/node', message: 'Node-only; browsers use @tropline/core.' },
            {
              name: '@tropline/core',
              message: "Import '@tropline/core/contract': the full barrel carries the engine.",
            },
          ],
          patterns: [{ group: ['**/shared/*', '**/shared'], message: "Import '@tropline/core'." }],
        },
      ],
    },
  },
  {
    files: ['projects/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: ['tropline', 'tc', 'lla'], style: 'kebab-case' },
      ],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: ['tropline', 'tc', 'lla'], style: 'camelCase' },
      ],
      '@angular-eslint/prefer-on-push-component-change-detection': 'error',
    },
  },
  {
    files: ['projects/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
);
