/**
 * The server's folders form a layered graph: reading every import of every file under server/, no
 * folder reaches back into a folder that (directly or through others) imports it. Files at the top
 * of server/ (app, features, deps, config, events) compose the folders and are left out.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const serverDir = resolve(__dirname, '../../server');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    return entry.name.endsWith('.ts') ? [path] : [];
  });
}

/** The top folder under server/ a path lies in, or null for the files at the top. */
function folderOf(path: string): string | null {
  const [top, ...rest] = relative(serverDir, path).split(sep);
  return top && rest.length > 0 && !top.startsWith('..') ? top : null;
}

/** Folder → folders it imports (type-only imports count too), with one file for each edge. */
function folderGraph(): Map<string, Map<string, string>> {
  const graph = new Map<string, Map<string, string>>();
  for (const file of sourceFiles(serverDir)) {
    const from = folderOf(file);
    if (!from) continue;
    const edges = graph.get(from) ?? new Map<string, string>();
    graph.set(from, edges);
    for (const ref of ts.preProcessFile(readFileSync(file, 'utf8'), true, true).importedFiles) {
      if (!ref.fileName.startsWith('.')) continue;
      const to = folderOf(resolve(dirname(file), ref.fileName));
      if (to && to !== from && !edges.has(to)) edges.set(to, relative(serverDir, file));
    }
  }
  return graph;
}

/** Every cycle found by a depth-first walk, each as the folders along it. */
function cycles(graph: Map<string, Map<string, string>>): string[][] {
  const found: string[][] = [];
  const done = new Set<string>();
  const walk = (node: string, path: string[]) => {
    const at = path.indexOf(node);
    if (at >= 0) return void found.push([...path.slice(at), node]);
    if (done.has(node)) return;
    for (const next of graph.get(node)?.keys() ?? []) walk(next, [...path, node]);
    done.add(node);
  };
  for (const node of graph.keys()) walk(node, []);
  return found;
}

describe('server folders', () => {
  it('import each other without a loop', () => {
    const graph = folderGraph();
    const loops = cycles(graph).map((loop) =>
      loop
        .slice(1)
        .map((to, i) => `${loop[i]} → ${to} (${graph.get(loop[i] ?? '')?.get(to)})`)
        .join(', '),
    );
    expect(loops).toEqual([]);
  });

  it('finds a loop when there is one', () => {
    const graph = new Map([
      ['a', new Map([['b', 'a/x.ts']])],
      ['b', new Map([['c', 'b/y.ts']])],
      ['c', new Map([['a', 'c/z.ts']])],
    ]);
    expect(cycles(graph)).toEqual([['a', 'b', 'c', 'a']]);
  });
});
