// `npm run dev`: the back end as `npm start` runs it (demo fleet included unless DEMO=off), with Vite's
// dev server in front of the client; /api and the live feed are proxied to the back end.
import 'dotenv/config';
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { SERVICE_NODE_FLAGS } from './lib/service-node-flags';

const backend = spawn(process.execPath, [...SERVICE_NODE_FLAGS, '--import', 'tsx', 'scripts/start.ts'], {
  stdio: 'inherit',
  env: process.env,
});
const vite = spawn(process.execPath, [join('node_modules', 'vite', 'bin', 'vite.js'), '--host', '127.0.0.1'], { stdio: 'inherit', env: process.env });
const stop = () => {
  vite.kill('SIGTERM');
  backend.kill('SIGTERM');
};
process.once('SIGINT', stop);
process.once('SIGTERM', stop);
backend.on('exit', (code) => {
  vite.kill('SIGTERM');
  process.exitCode = code ?? 0;
});
