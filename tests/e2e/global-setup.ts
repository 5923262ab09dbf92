/**
 * Builds the client and the server bundle once before the browser tests, exactly as `npm start` does.
 */
import { execFileSync } from 'node:child_process';

export default function setup(): void {
  if (process.env.E2E_SKIP_BUILD === '1') return;
  execFileSync('npm', ['run', '-s', 'build'], { stdio: 'inherit', cwd: process.cwd() });
}
