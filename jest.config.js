// One jest run covers every suite; `--selectProjects <name>` runs one of them.
const swcTransform = [
  '@swc/jest',
  { jsc: { parser: { syntax: 'typescript' }, target: 'es2022' }, module: { type: 'commonjs' } },
];

const nodeProject = (displayName, roots, extra = {}) => ({
  displayName,
  rootDir: __dirname,
  roots,
  testEnvironment: 'node',
  testMatch: ['**/*.test.ts'],
  transform: { '^.+\\.ts$': swcTransform },
  moduleNameMapper: { '^@spanledger/shared$': '<rootDir>/shared/src/index.ts' },
  ...extra,
});

/** @type {import('jest').Config} */
module.exports = {
  projects: [
    nodeProject('shared', ['<rootDir>/shared']),
    nodeProject('backend', ['<rootDir>/backend']),
    nodeProject('cli', ['<rootDir>/tests/cli'], { testTimeout: 30000 }),
    nodeProject('api', ['<rootDir>/tests/api'], {
      globalSetup: '<rootDir>/tests/support/api-global-setup.ts',
      globalTeardown: '<rootDir>/tests/support/global-teardown.ts',
      setupFilesAfterEnv: ['<rootDir>/tests/support/api-timeout.ts'],
    }),
    nodeProject('browser', ['<rootDir>/tests/browser'], {
      globalSetup: '<rootDir>/tests/support/browser-global-setup.ts',
      globalTeardown: '<rootDir>/tests/support/global-teardown.ts',
      setupFilesAfterEnv: ['<rootDir>/tests/support/browser-timeout.ts'],
    }),
    '<rootDir>/frontend/jest.config.ts',
  ],
};
