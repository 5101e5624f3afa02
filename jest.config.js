/** Two projects: fast unit tests (statistics core, cell functions, host contract) and browser tests
 * (Debian's Chromium via playwright-core against the workbench). */
const tsJest = ['ts-jest', { tsconfig: 'tsconfig.json', diagnostics: { ignoreCodes: [151001] } }];
module.exports = {
  projects: [
    {
      displayName: 'unit',
      testEnvironment: 'node',
      transform: { '^.+\\.ts$': tsJest },
      testMatch: ['<rootDir>/test/unit/**/*.test.ts'],
      setupFiles: ['<rootDir>/test/setup/fast-check-seed.js'],
    },
    {
      displayName: 'browser',
      testEnvironment: 'node',
      transform: { '^.+\\.ts$': tsJest },
      testMatch: ['<rootDir>/test/browser/**/*.test.ts'],
    },
  ],
};
