/** @jest-config-loader esbuild-register */
import type { Config } from 'jest';
import presets from 'jest-preset-angular/presets';

const config: Config = {
  ...presets.createCjsPreset({
    testEnvironment: 'jest-preset-angular/environments/jest-jsdom-env',
    tsconfig: '<rootDir>/tsconfig.spec.json',
  }),
  displayName: 'frontend',
  rootDir: __dirname,
  roots: ['<rootDir>/src'],
  setupFilesAfterEnv: ['<rootDir>/src/test-setup.ts'],
  moduleNameMapper: {
    '^@spanledger/shared$': '<rootDir>/../shared/src/index.ts',
  },
  // Angular and friends ship ES modules only (.mjs); let the preset compile them for CommonJS Jest.
  transformIgnorePatterns: ['node_modules/(?!(.*\\.mjs$|@angular/common/locales/.*\\.js$))'],
};

export default config;
