import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { inRepo, repoRoot } from './paths.mjs';

const TEST_FILE = /\.(test|spec)\.[cm]?[jt]sx?$/;
const NOT_SOURCE = new Set(['node_modules', 'dist', 'out', '.data']);

/** Workspace folders from the root package.json ("packages/*", "apps/*", "tests"), relative to the repository. */
export function listWorkspaces() {
  const { workspaces = [] } = JSON.parse(readFileSync(inRepo('package.json'), 'utf8'));
  return workspaces.flatMap((pattern) => {
    if (!pattern.endsWith('/*')) return existsSync(inRepo(pattern, 'package.json')) ? [pattern] : [];
    const parent = pattern.slice(0, -2);
    if (!existsSync(inRepo(parent))) return [];
    return readdirSync(inRepo(parent), { withFileTypes: true })
      .filter((entry) => entry.isDirectory() && existsSync(inRepo(parent, entry.name, 'package.json')))
      .map((entry) => `${parent}/${entry.name}`)
      .sort();
  });
}

/**
 * The fixed order first; a workspace added since goes after the others of its folder (a new package before the apps,
 * a new app before the browser tests), so its tests run without anyone editing this list.
 */
export function orderWorkspaces(fixedOrder, present) {
  const extras = present.filter((w) => !fixedOrder.includes(w));
  const ordered = fixedOrder.filter((w) => present.includes(w));
  for (const extra of extras) {
    const folder = extra.split('/')[0];
    const lastOfFolder = ordered.findLastIndex((w) => w.split('/')[0] === folder);
    ordered.splice(lastOfFolder === -1 ? ordered.length : lastOfFolder + 1, 0, extra);
  }
  return ordered;
}

export function hasTestFiles(workspace) {
  const walk = (dir) =>
    readdirSync(dir, { withFileTypes: true }).some((entry) => {
      if (entry.isDirectory()) return !NOT_SOURCE.has(entry.name) && !entry.name.startsWith('.') && walk(join(dir, entry.name));
      return TEST_FILE.test(entry.name);
    });
  return walk(join(repoRoot, workspace));
}
