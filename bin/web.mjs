#!/usr/bin/env node
// Browser mode: builds the renderer and serves it on 127.0.0.1 (port from --port, default
// 4173), printing the address. The browser tests and `npm start` without Electron use it.
import { build, preview } from 'vite';

const args = process.argv.slice(2);
const portIndex = args.indexOf('--port');
const port = portIndex >= 0 ? Number(args[portIndex + 1]) : 4173;
if (!Number.isInteger(port) || port < 1 || port > 65535) {
  console.error(`--port: "${args[portIndex + 1]}" is not a port number, expected 1 to 65535`);
  process.exit(2);
}
const configFile = new URL('../renderer/vite.config.ts', import.meta.url).pathname;
if (!args.includes('--no-build')) await build({ configFile, logLevel: 'warn' });
const server = await preview({ configFile, preview: { host: '127.0.0.1', port, strictPort: true } });
const address = `http://127.0.0.1:${port}/${args.includes('--demo') ? '?demo' : ''}`;
console.log(`Ebbline is served at ${address} (press Ctrl+C to stop)`);
const stop = () => server.httpServer.close(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
