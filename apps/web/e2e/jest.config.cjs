// Browser tests: real Chromium (playwright-core) against a running Kerfwright (KW_BASE_URL).
/** @type {import('jest').Config} */
module.exports = {
  rootDir: __dirname,
  testEnvironment: 'node',
  testMatch: ['<rootDir>/**/*.browser.spec.ts'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.json' }],
  },
  testTimeout: 60000,
  maxWorkers: 1,
};
