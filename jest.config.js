// One jest run for every part of Ringlet (see DEVELOPERS.md, "Tests").
const nodeTransform = {
  '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.node.json' }],
};
const moduleNameMapper = { '^@ringlet/shared/(.*)$': '<rootDir>/shared/$1' };

/** @type {import('jest').Config} */
module.exports = {
  // bcrypt at cost 12 takes ~0.3 s a hash on this 2-core machine; browser tests set their own.
  testTimeout: 90000,
  // A worker leaves once its event loop is empty. Jest's default wait for that is 500 ms; with a
  // server-sized heap on a loaded 2-core machine the exit itself took longer, and jest killed the
  // worker and printed "a worker process has failed to exit gracefully". Measured: in-band,
  // --detectOpenHandles finds no open handle, and with 5 s every worker leaves by itself; a real
  // leaked handle still shows as that warning after the 5 s.
  workerGracefulExitTimeout: 5000,
  projects: [
    {
      displayName: 'shared',
      testEnvironment: 'node',
      transform: nodeTransform,
      moduleNameMapper,
      testMatch: ['<rootDir>/shared/**/*.spec.ts'],
    },
    {
      displayName: 'api',
      testEnvironment: 'node',
      transform: nodeTransform,
      moduleNameMapper,
      testMatch: [
        '<rootDir>/api/**/*.spec.ts',
        '<rootDir>/db/**/*.spec.ts',
        '<rootDir>/reports/**/*.spec.ts',
      ],
    },
    {
      displayName: 'web',
      preset: 'jest-preset-angular',
      testEnvironment: 'jsdom',
      setupFilesAfterEnv: ['<rootDir>/web/src/test-setup.ts'],
      moduleNameMapper,
      testMatch: ['<rootDir>/web/src/**/*.spec.ts'],
      transform: {
        '^.+\\.(ts|js|mjs|html|svg)$': [
          'jest-preset-angular',
          {
            tsconfig: '<rootDir>/web/tsconfig.spec.json',
            stringifyContentPathRegex: '\\.(html|svg)$',
          },
        ],
      },
      transformIgnorePatterns: ['node_modules/(?!.*\\.mjs$)'],
    },
    {
      displayName: 'e2e',
      testEnvironment: 'node',
      transform: nodeTransform,
      moduleNameMapper,
      testMatch: ['<rootDir>/web/e2e/**/*.e2e.ts'],
    },
  ],
};
