import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CORE_VERSION } from './version.js';

describe('CORE_VERSION', () => {
  it('equals the version in physics-core/package.json', () => {
    const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(CORE_VERSION).toBe(pkg.version);
  });
});
