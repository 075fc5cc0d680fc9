import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** Builds @quietglass/shared so the tests import the same dist the CLI and backend use. */
export default function setup(): void {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  execFileSync('npm', ['run', 'build', '-w', 'shared', '--silent'], { cwd: root, stdio: 'inherit' });
}
