// Jest on native ESM (run with NODE_OPTIONS=--experimental-vm-modules, see package.json).
// physics-core is consumed from its TypeScript source through the `@phasewright/source` condition.
export default {
  testEnvironment: 'node',
  testEnvironmentOptions: { customExportConditions: ['@phasewright/source', 'node', 'node-addons'] },
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testRegex: '\\.(spec|e2e-spec)\\.ts$',
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  extensionsToTreatAsEsm: ['.ts'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { useESM: true, tsconfig: '<rootDir>/tsconfig.json' }],
  },
  moduleNameMapper: { '^(\\.{1,2}/.*)\\.js$': '$1' },
  testTimeout: 30_000,
};
