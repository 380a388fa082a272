// Unit tests live beside the code as *.spec.ts under src/.
module.exports = {
  ...require('./test/jest-shared.js'),
  rootDir: '.',
  roots: ['<rootDir>/src'],
  testMatch: ['**/*.spec.ts'],
};
