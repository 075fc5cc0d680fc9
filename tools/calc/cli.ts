/*
 * Batch optics calculations from the command line: a stack file in, R, T and A over a grid out.
 * The logic lives here as plain functions (tests call them directly); main.ts only wires up the
 * process.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import {
  BACK_SURFACES,
  OpticsInputError,
  POLARISATIONS,
  calculateSpectrum,
  evenWavelengthsNm,
  parseStack,
  spectrumIndex,
  type BackSurface,
  type OpticalStack,
  type Polarisation,
  type SpectrumOutput,
  type SpectrumPlan,
} from '@quietglass/shared';

export const CSV_HEADER = 'wavelength_nm,angle_deg,pol,R,T,A';

export const USAGE = `Usage: npm run calc -- --stack FILE.json [options]

  --stack FILE          stack file (JSON; layers listed from the incident side to the substrate)
  --from NM --to NM --step NM
                        evenly spaced wavelengths (default 380 to 780 by 1 nm)
  --wavelengths A,B,…   listed wavelengths in nm instead of a range
  --angles A,B,…        angles of incidence in degrees (default 0)
  --pol s,p,avg         polarisations (default avg, the average of s and p)
  --back none|incoherent
                        none: semi-infinite substrate, the front surface alone (default);
                        incoherent: thick substrate with its back surface, as a spectrophotometer
                        measures the part (needs substrate.thickness_mm if the substrate absorbs)
  --format csv|json     output format (default csv: ${CSV_HEADER}, fractions 0–1)
  --help                this text`;

export type OutputFormat = 'csv' | 'json';

export interface CalcArgs {
  stackFile: string;
  wavelengthsNm: number[];
  anglesDeg: number[];
  polarisations: Polarisation[];
  back: BackSurface;
  format: OutputFormat;
}

/** A mistake on the command line (exit code 2, with the usage text). */
export class UsageError extends Error {
  override readonly name = 'UsageError';
}

const VALUE_OPTIONS = [
  '--stack',
  '--from',
  '--to',
  '--step',
  '--wavelengths',
  '--angles',
  '--pol',
  '--back',
  '--format',
];

function parseNumber(text: string, option: string): number {
  const value = text.trim() === '' ? Number.NaN : Number(text);
  if (!Number.isFinite(value)) throw new UsageError(`${option}: "${text}" is not a number`);
  return value;
}

function parseList(text: string, option: string): string[] {
  const items = text.split(',').map((s) => s.trim());
  if (items.some((s) => s === '')) throw new UsageError(`${option}: empty entry in "${text}"`);
  return items;
}

function pick<T extends string>(value: string, allowed: readonly T[], option: string): T {
  if (!(allowed as readonly string[]).includes(value)) {
    throw new UsageError(`${option}: "${value}" is not one of ${allowed.join(', ')}`);
  }
  return value as T;
}

/** Parses the command-line arguments (without `node` and the script). Throws UsageError. */
export function parseCalcArgs(argv: readonly string[]): CalcArgs | 'help' {
  const seen = new Map<string, string>();
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i] ?? '';
    if (arg === '--help' || arg === '-h') return 'help';
    const eq = arg.indexOf('=');
    const name = arg.startsWith('--') && eq > 0 ? arg.slice(0, eq) : arg;
    if (!VALUE_OPTIONS.includes(name)) throw new UsageError(`unknown argument "${arg}"`);
    if (seen.has(name)) throw new UsageError(`${name} is given twice`);
    const value = eq > 0 && name !== arg ? arg.slice(eq + 1) : argv[++i];
    if (value === undefined || (value.startsWith('--') && eq < 0))
      throw new UsageError(`${name} needs a value`);
    seen.set(name, value);
  }
  const stackFile = seen.get('--stack');
  if (stackFile === undefined) throw new UsageError('--stack FILE is required');

  const range = ['--from', '--to', '--step'].filter((o) => seen.has(o));
  const listed = seen.get('--wavelengths');
  if (listed !== undefined && range.length > 0) {
    throw new UsageError(`give either --wavelengths or ${range.join('/')}, not both`);
  }
  let wavelengthsNm: number[];
  if (listed !== undefined) {
    wavelengthsNm = parseList(listed, '--wavelengths').map((s) => parseNumber(s, '--wavelengths'));
  } else {
    const from = parseNumber(seen.get('--from') ?? '380', '--from');
    const to = parseNumber(seen.get('--to') ?? '780', '--to');
    const step = parseNumber(seen.get('--step') ?? '1', '--step');
    try {
      wavelengthsNm = evenWavelengthsNm(from, to, step, ['--from', '--to', '--step']);
    } catch (error) {
      if (error instanceof OpticsInputError) throw new UsageError(error.message);
      throw error;
    }
  }
  const anglesDeg = parseList(seen.get('--angles') ?? '0', '--angles').map((s) => parseNumber(s, '--angles'));
  const polarisations = parseList(seen.get('--pol') ?? 'avg', '--pol').map((s) =>
    pick(s, POLARISATIONS, '--pol'),
  );
  const back = pick(seen.get('--back') ?? 'none', BACK_SURFACES, '--back');
  const format = pick(seen.get('--format') ?? 'csv', ['csv', 'json'] as const, '--format');
  return { stackFile, wavelengthsNm, anglesDeg, polarisations, back, format };
}

/** A stack file that cannot be used: its message names the file and, where it applies, the field. */
export class StackFileError extends Error {
  override readonly name = 'StackFileError';
}

/** Reads and validates a stack file (JSON). Throws StackFileError naming the file and field. */
export function loadStackFile(
  path: string,
  read: (path: string) => string = (p) => readFileSync(p, 'utf8'),
): OpticalStack {
  let text: string;
  try {
    text = read(path);
  } catch (error) {
    throw new StackFileError(`cannot read ${path}: ${(error as Error).message}`);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    throw new StackFileError(`${path} is not valid JSON: ${(error as Error).message}`);
  }
  try {
    return parseStack(data);
  } catch (error) {
    if (error instanceof OpticsInputError) throw new StackFileError(`${path}: ${error.message}`);
    throw error;
  }
}

/** Grid fields of the engine → the options the user typed. */
const GRID_OPTIONS: Record<string, string> = {
  wavelengthsNm: '--wavelengths',
  anglesDeg: '--angles',
  polarisations: '--pol',
  back: '--back',
};

/** Computes the spectrum a parsed command line asks for. */
export function computeCalc(args: CalcArgs, stack: OpticalStack): SpectrumOutput & { plan: SpectrumPlan } {
  try {
    return calculateSpectrum(
      stack,
      { wavelengthsNm: args.wavelengthsNm, anglesDeg: args.anglesDeg, polarisations: args.polarisations },
      { back: args.back },
    );
  } catch (error) {
    if (!(error instanceof OpticsInputError)) throw error;
    const root = error.field.split(/[.[]/)[0] ?? '';
    const option = GRID_OPTIONS[root];
    if (option) throw new UsageError(`${option}: ${error.problem}`);
    throw new StackFileError(`${args.stackFile}: ${error.message}`);
  }
}

/** One output row per (angle, polarisation, wavelength), spectra contiguous. */
function* rows(result: SpectrumOutput & { plan: SpectrumPlan }) {
  const { plan } = result;
  for (let ia = 0; ia < plan.anglesDeg.length; ia++) {
    for (let ip = 0; ip < plan.polarisations.length; ip++) {
      for (let iw = 0; iw < plan.wavelengthsNm.length; iw++) {
        const i = spectrumIndex(plan, ip, ia, iw);
        yield {
          wavelength_nm: plan.wavelengthsNm[iw],
          angle_deg: plan.anglesDeg[ia],
          pol: plan.polarisations[ip],
          R: result.R[i],
          T: result.T[i],
          A: result.A[i],
        };
      }
    }
  }
}

/**
 * CSV with the header wavelength_nm,angle_deg,pol,R,T,A; numbers in JavaScript's shortest
 * round-trip form, so they read back as exactly the computed doubles.
 */
export function formatCsv(result: SpectrumOutput & { plan: SpectrumPlan }): string {
  const lines = [CSV_HEADER];
  for (const r of rows(result)) lines.push(`${r.wavelength_nm},${r.angle_deg},${r.pol},${r.R},${r.T},${r.A}`);
  return `${lines.join('\n')}\n`;
}

/** JSON: an array of rows with the CSV's column names. */
export function formatJson(result: SpectrumOutput & { plan: SpectrumPlan }): string {
  return `${JSON.stringify([...rows(result)], null, 1)}\n`;
}

export interface CalcIO {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  readFile?: (path: string) => string;
  /** Directory relative stack paths are taken from (npm sets INIT_CWD to where the user typed). */
  cwd?: string;
}

/** Runs the CLI; returns the exit code (0 ok, 1 bad stack file, 2 bad command line). */
export function runCalc(argv: readonly string[], io: CalcIO): number {
  try {
    const args = parseCalcArgs(argv);
    if (args === 'help') {
      io.stdout(`${USAGE}\n`);
      return 0;
    }
    const path = resolve(io.cwd ?? process.cwd(), args.stackFile);
    const stack = loadStackFile(path, io.readFile);
    const result = computeCalc({ ...args, stackFile: path }, stack);
    for (const warning of result.plan.warnings) io.stderr(`warning: ${warning}\n`);
    io.stdout(args.format === 'csv' ? formatCsv(result) : formatJson(result));
    return 0;
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`error: ${error.message}\n\n${USAGE}\n`);
      return 2;
    }
    if (error instanceof StackFileError) {
      io.stderr(`error: ${error.message}\n`);
      return 1;
    }
    throw error;
  }
}
