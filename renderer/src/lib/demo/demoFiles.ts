/**
 * The invented demo workspace's statement files, served beside the app as static assets
 * (copied from resources/demo/statements at build time by the `demoStatements` Vite
 * plugin, with `demo/manifest.json` listing them). They are read as bytes and go through
 * exactly the import path of a user's files.
 */
import type { PickedFile } from '../host/hostBridge';

/** Name of the demo workspace. */
export const DEMO_WORKSPACE_NAME = 'Tessellate Ceramics (demo)';

/** `demo/manifest.json`. */
export interface DemoManifest {
  readonly schema: 'ebbline.demo/1';
  readonly files: readonly string[];
}

/**
 * Fetches the demo statements in manifest order.
 * @throws Error when the manifest or a file cannot be fetched.
 */
export async function fetchDemoFiles(base = './demo/'): Promise<PickedFile[]> {
  const response = await fetch(`${base}manifest.json`);
  if (!response.ok) throw new Error(`the demo statements are missing (manifest: HTTP ${response.status})`);
  const manifest = (await response.json()) as DemoManifest;
  if (manifest.schema !== 'ebbline.demo/1' || !Array.isArray(manifest.files)) {
    throw new Error('the demo manifest is not an ebbline.demo/1 document');
  }
  return Promise.all(
    manifest.files.map(async (name) => {
      const r = await fetch(`${base}statements/${encodeURIComponent(name)}`);
      if (!r.ok) throw new Error(`the demo file ${name} is missing (HTTP ${r.status})`);
      return { name, bytes: new Uint8Array(await r.arrayBuffer()) };
    }),
  );
}
