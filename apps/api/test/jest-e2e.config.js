/** End-to-end tests against the real PostgreSQL and Redis started by scripts/test.sh. */
module.exports = {
  ...require('./jest-shared.js'),
  rootDir: '..',
  roots: ['<rootDir>/test'],
  testMatch: ['**/*.e2e-spec.ts'],
  maxWorkers: 1,
  testTimeout: 30000,
};
