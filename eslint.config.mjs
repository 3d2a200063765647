// Lint: Nuxt's ESLint module (its flat config is generated into .nuxt by `nuxt prepare`, which `npm install` runs),
// typescript-eslint's type-checked recommended rules on the server and the shared engine (the .ts files of app/ and tests/
// get the plain recommended set: type-aware linting of every project there cost minutes on two cores), and the project's rules.
import tseslint from 'typescript-eslint'
import withNuxt from './.nuxt/eslint.config.mjs'

// The rules of `recommendedTypeChecked` that need type information (the rest already come with Nuxt's config).
const typeCheckedRules = Object.assign({}, ...tseslint.configs.recommendedTypeCheckedOnly.map(c => c.rules ?? {}))

export default withNuxt(
  { ignores: ['.nuxt/**', '.output/**', '.nuxt-*/**', '.output-*/**', '.data/**', 'node_modules/**', 'coverage/**', 'test-results/**', 'migrations/**'] },
  {
    name: 'pastload/type-checked',
    files: ['server/**/*.ts', 'shared/**/*.ts'],
    languageOptions: {
      parserOptions: {
        // The two programs Nuxt generates for these folders (strict, noUncheckedIndexedAccess, Nitro's auto-imports).
        project: ['./.nuxt/tsconfig.server.json', './.nuxt/tsconfig.shared.json'],
        tsconfigRootDir: import.meta.dirname,
      },
    },
    rules: typeCheckedRules,
  },
  {
    name: 'pastload/rules',
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' }],
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': ['error', { html: { void: 'always', normal: 'never', component: 'always' } }],
      'no-console': ['error', { allow: ['info', 'warn', 'error'] }],
    },
  },
  {
    // A `!` hides a fact the types could carry: warned everywhere, refused where none are left.
    name: 'pastload/non-null',
    rules: { '@typescript-eslint/no-non-null-assertion': 'warn' },
  },
  {
    files: ['server/db/**/*.ts', 'server/utils/**/*.ts', 'server/services/**/*.ts', 'shared/review/**/*.ts', 'shared/investigation/**/*.ts'],
    ignores: ['server/services/lab.ts', 'server/services/imports*/**', 'server/services/imports*.ts', 'server/services/site-models.ts', 'server/services/model-versions.ts'],
    rules: { '@typescript-eslint/no-non-null-assertion': 'error' },
  },
  {
    files: ['scripts/**/*.mjs', 'tests/**/*.ts'],
    rules: { 'no-console': 'off' },
  },
  {
    // In a test a wrong `!` fails that test at once, which is what the test is for.
    files: ['tests/**/*.ts'],
    rules: { '@typescript-eslint/no-non-null-assertion': 'off' },
  },
)
