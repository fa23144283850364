/**
 * Vite plugin: serves the committed demo statements (resources/demo/statements) under
 * `demo/statements/` with a `demo/manifest.json` listing them, in the dev server and in
 * the build, so the app's "Open the demo workspace" reads them like any user's files.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { Plugin } from 'vite';

/** Sorted names of the statement files in `dir` (no dot files, no folders). */
export function demoStatementNames(dir: string): string[] {
  return readdirSync(dir)
    .filter((name) => !name.startsWith('.') && statSync(join(dir, name)).isFile())
    .sort();
}

/** The manifest document. */
export function demoManifest(dir: string): string {
  return JSON.stringify({ schema: 'ebbline.demo/1', files: demoStatementNames(dir) }, null, 2) + '\n';
}

export function demoStatements(dir: string): Plugin {
  return {
    name: 'ebbline-demo-statements',
    configureServer(server) {
      server.middlewares.use((req, res, next) => {
        const url = (req.url ?? '').split('?')[0] ?? '';
        if (url.endsWith('/demo/manifest.json')) {
          res.setHeader('Content-Type', 'application/json');
          res.end(demoManifest(dir));
          return;
        }
        const m = /\/demo\/statements\/([^/]+)$/.exec(url);
        const name = m ? decodeURIComponent(m[1] as string) : undefined;
        if (name && demoStatementNames(dir).includes(name)) {
          res.setHeader('Content-Type', 'application/octet-stream');
          res.end(readFileSync(join(dir, name)));
          return;
        }
        next();
      });
    },
    generateBundle() {
      this.emitFile({ type: 'asset', fileName: 'demo/manifest.json', source: demoManifest(dir) });
      for (const name of demoStatementNames(dir)) {
        this.emitFile({ type: 'asset', fileName: `demo/statements/${name}`, source: readFileSync(join(dir, name)) });
      }
    },
  };
}
