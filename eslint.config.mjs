// ESLint flat config: Next.js's rules (core web vitals), React hooks and typescript-eslint's recommended set.
// Errors are for real problems; style is left to habit and review.
import nextCoreWebVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';

const config = [
  {
    ignores: [
      'node_modules/**',
      '.next/**',
      '.next-*/**',
      '.worker-dist/**',
      '.denudata/**',
      '.stryker-tmp/**',
      'reports/**',
      'public/**',
      'next-env.d.ts',
    ],
  },
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    rules: {
      'react-hooks/exhaustive-deps': 'error',
      'react-hooks/rules-of-hooks': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/no-unused-expressions': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports', disallowTypeAnnotations: false }],
      // React Compiler diagnostics (react-hooks 7). We do not run the compiler, but follow its rules: refs are
      // written in effects (components/ui/use-latest.ts) and read in events, never during render; state that
      // follows a prop is adjusted while rendering, state read from the browser comes from useSyncExternalStore.
      // `npm run lint` refuses any warning as well (--max-warnings 0).
      'react-hooks/refs': 'error',
      'react-hooks/set-state-in-effect': 'error',
    },
  },
  {
    // Tests read arbitrary JSON answers from the API.
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
];

export default config;
