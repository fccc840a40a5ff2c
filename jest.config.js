/** Jest: ts-jest in Node; one test file per source file under test/, outside checks in test/reference. */
module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/test'],
  testMatch: ['**/*.test.ts'],
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: 'tsconfig.json' }] },
  testTimeout: 120000,
  reporters: ['default', '<rootDir>/test/summary-reporter.js'],
};
