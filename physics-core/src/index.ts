/** Public entry of physics-core: named exports only. */
export * from './model/types.js';
export * from './result.js';
export * from './errors.js';
export const CORE_VERSION = '0.1.0';
