import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** Walk up from `start` to the first folder whose package.json matches `accept`. */
function findUp(start: string, accept: (pkg: { name?: string; workspaces?: unknown }) => boolean): string | null {
  let dir = start;
  for (;;) {
    const file = path.join(dir, 'package.json');
    if (fs.existsSync(file)) {
      const pkg = JSON.parse(fs.readFileSync(file, 'utf8')) as { name?: string; workspaces?: unknown };
      if (accept(pkg)) return dir;
    }
    const parent = path.dirname(dir);
    if (parent === dir) return null;
    dir = parent;
  }
}

const here = path.dirname(fileURLToPath(import.meta.url));

/** The sync-server package folder (works from src/ under Jest and from dist/src/ in production). */
export const serverRoot: string =
  findUp(here, (p) => p.name === '@phasewright/sync-server') ?? path.resolve(here, '..', '..');

/** The repository root (the npm workspaces root), or the server's parent when deployed alone. */
export const repoRoot: string = findUp(serverRoot, (p) => Array.isArray(p.workspaces)) ?? path.dirname(serverRoot);

/** The server's own version, from its package.json. */
export const serverVersion: string = (
  JSON.parse(fs.readFileSync(path.join(serverRoot, 'package.json'), 'utf8')) as { version: string }
).version;
