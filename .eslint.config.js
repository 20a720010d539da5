// @ts-check
import js from '@eslint/js'
import prettier from 'eslint-config-prettier'
import vue from 'eslint-plugin-vue'
import globals from 'globals'
import tseslint from 'typescript-eslint'

/** shared/ runs in the browser, the server and the jobs alike: no environment, no I/O. */
const sharedZone = {
  files: ['shared/**/*.ts'],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: [
          {
            group: [
              'node:*',
              'fs',
              'path',
              'http',
              'pg',
              'express',
              'drizzle-orm',
              'drizzle-orm/*',
            ],
            message: 'shared/ does no I/O.',
          },
          {
            group: ['**/server/**', '**/src/**', '**/jobs/**', '@/*'],
            message: 'shared/ imports neither the client nor the server.',
          },
        ],
      },
    ],
    'no-restricted-globals': [
      'error',
      'window',
      'document',
      'process',
      'localStorage',
      'fetch',
      'Buffer',
      'require',
    ],
  },
}

export default tseslint.config(
  {
    ignores: [
      'dist/**',
      'drizzle/**',
      '.data/**',
      '.tmp/**',
      'node_modules/**',
      'tests/e2e/artifacts/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...vue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser } },
  },
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/ban-ts-comment': [
        'error',
        { 'ts-expect-error': 'allow-with-description', 'ts-ignore': true },
      ],
      'vue/multi-word-component-names': ['error', { ignores: ['App'] }],
    },
  },
  {
    files: ['src/**/*.{ts,vue}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/server/**', '**/jobs/**', 'pg', 'express', 'drizzle-orm'],
              message: 'The client talks to the server over the API only.',
            },
          ],
        },
      ],
    },
  },
  sharedZone,
  prettier,
)
