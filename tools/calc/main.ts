/*
 * `npm run calc -- --stack FILE.json …` (see cli.ts for the options). Relative paths are taken from
 * the directory the command was typed in.
 */
import { runCalc } from './cli.js';

process.exitCode = runCalc(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  cwd: process.env.INIT_CWD ?? process.cwd(),
});
