import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { referenceResponse } from '@quietglass/shared/optics/reference';
import { describe, expect, it } from 'vitest';
import { CSV_HEADER, parseCalcArgs, runCalc, UsageError } from './cli.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const example = fileURLToPath(new URL('./examples/two-layer.json', import.meta.url));

/** Runs the CLI in-process with files taken from `files` (or the disk). */
function run(argv: string[], files: Record<string, string> = {}) {
  let stdout = '';
  let stderr = '';
  const code = runCalc(argv, {
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    cwd: '/virtual',
    readFile: (path) => {
      const name = path.replace('/virtual/', '');
      return files[name] ?? readFileSync(path, 'utf8');
    },
  });
  return { code, stdout, stderr };
}

function csvRows(stdout: string) {
  const [header, ...lines] = stdout.trim().split('\n');
  expect(header).toBe(CSV_HEADER);
  return lines.map((line) => {
    const [wl, angle, pol, R, T, A] = line.split(',');
    return {
      wl: Number(wl),
      angle: Number(angle),
      pol,
      R: Number(R),
      T: Number(T),
      A: Number(A),
      text: { R: R ?? '' },
    };
  });
}

describe('argument parsing', () => {
  it('has the documented defaults: 380–780 nm by 1 nm, 0°, avg, front surface, CSV', () => {
    const args = parseCalcArgs(['--stack', 's.json']);
    expect(args).not.toBe('help');
    if (args === 'help') return;
    expect(args.wavelengthsNm).toHaveLength(401);
    expect(args.wavelengthsNm[0]).toBe(380);
    expect(args.wavelengthsNm[400]).toBe(780);
    expect(args).toMatchObject({
      stackFile: 's.json',
      anglesDeg: [0],
      polarisations: ['avg'],
      back: 'none',
      format: 'csv',
    });
  });

  it('reads lists, ranges and --option=value', () => {
    expect(
      parseCalcArgs(['--stack=s.json', '--wavelengths', '450,550', '--angles=0,45', '--pol', 's,p']),
    ).toMatchObject({
      wavelengthsNm: [450, 550],
      anglesDeg: [0, 45],
      polarisations: ['s', 'p'],
    });
    expect(parseCalcArgs(['--stack', 's', '--from', '400', '--to', '401', '--step', '0.25'])).toMatchObject({
      wavelengthsNm: [400, 400.25, 400.5, 400.75, 401],
    });
    expect(parseCalcArgs(['--help'])).toBe('help');
  });

  it.each([
    [[], /--stack FILE is required/],
    [['--stack'], /--stack needs a value/],
    [['--stack', 's', '--colour', 'red'], /unknown argument "--colour"/],
    [['--stack', 's', '--wavelengths', '450', '--from', '400'], /either --wavelengths or --from/],
    [['--stack', 's', '--wavelengths', '450,,550'], /empty entry/],
    [['--stack', 's', '--angles', 'ten'], /--angles: "ten" is not a number/],
    [['--stack', 's', '--pol', 'x'], /--pol: "x" is not one of s, p, avg/],
    [['--stack', 's', '--back', 'both'], /--back: "both" is not one of none, incoherent/],
    [['--stack', 's', '--from', '800', '--to', '700'], /--from: must not exceed --to/],
    [['--stack', 's', '--step', '0'], /--step: must be greater than 0/],
    [['--stack', 's', '--stack', 't'], /--stack is given twice/],
  ])('rejects %j', (argv, message) => {
    expect(() => parseCalcArgs(argv)).toThrow(UsageError);
    expect(() => parseCalcArgs(argv)).toThrow(message);
  });
});

describe('output', () => {
  it('prints CSV of a bare substrate: the Fresnel R = 0.042580 at every wavelength (Hecht ch. 4)', () => {
    const { code, stdout, stderr } = run(
      ['--stack', 'bare.json', '--from', '400', '--to', '700', '--step', '100'],
      {
        'bare.json': '{ "substrate": { "n": 1.52 }, "layers": [] }',
      },
    );
    expect(code).toBe(0);
    expect(stderr).toBe('');
    const rows = csvRows(stdout);
    expect(rows.map((r) => r.wl)).toEqual([400, 500, 600, 700]);
    for (const r of rows) {
      expect(r).toMatchObject({ angle: 0, pol: 'avg' });
      expect(r.R).toBeCloseTo(((1 - 1.52) / (1 + 1.52)) ** 2, 15);
      expect(r.T).toBeCloseTo(1 - r.R, 15);
      expect(Math.abs(r.A)).toBeLessThan(1e-15);
    }
  });

  it('prints the example stack’s R, T, A in full precision, matching the complex.js reference', () => {
    const { code, stdout } = run([
      '--stack',
      example,
      '--wavelengths',
      '450,550.5',
      '--angles',
      '0,45',
      '--pol',
      's,p',
    ]);
    expect(code).toBe(0);
    const rows = csvRows(stdout);
    // Order: angle, then polarisation, then wavelength.
    expect(rows.map((r) => `${r.angle}/${r.pol}/${r.wl}`)).toEqual([
      '0/s/450',
      '0/s/550.5',
      '0/p/450',
      '0/p/550.5',
      '45/s/450',
      '45/s/550.5',
      '45/p/450',
      '45/p/550.5',
    ]);
    const layers = [
      { n: 2.35, k: 0.0001, thicknessNm: 50 },
      { n: 1.46, k: 0, thicknessNm: 93.2 },
    ];
    for (const r of rows) {
      const ref = referenceResponse({
        incident: { n: 1, k: 0 },
        layers,
        exit: { n: 1.52, k: 0 },
        wavelengthNm: r.wl,
        angleDeg: r.angle,
        polarisation: r.pol as 's' | 'p',
      });
      expect(Math.abs(r.R - ref.R)).toBeLessThan(1e-12);
      expect(Math.abs(r.T - ref.T)).toBeLessThan(1e-12);
      expect(Math.abs(r.A - ref.A)).toBeLessThan(1e-12);
      expect(r.A).toBeGreaterThan(0); // k = 1e-4 in the first layer absorbs
    }
    // Full double precision: at least 15 significant digits are printed where the value has them.
    const firstR = csvRows(stdout)[0]?.text.R ?? '';
    expect(firstR.replace(/^0\.0*/, '').length).toBeGreaterThanOrEqual(15);
  });

  it('converts QWOT layers and prints JSON on request', () => {
    const { code, stdout } = run(['--stack', 'qw.json', '--wavelengths', '550', '--format', 'json'], {
      'qw.json': JSON.stringify({
        substrate: { n: 1.52 },
        reference_nm: 550,
        layers: [{ n: 1.38, qwot: 1 }],
      }),
    });
    expect(code).toBe(0);
    const rows = JSON.parse(stdout) as { wavelength_nm: number; R: number }[];
    expect(rows).toHaveLength(1);
    const [row] = rows as [(typeof rows)[number]];
    // Quarter-wave R = ((n0·ns − n1²)/(n0·ns + n1²))² = 0.012601 (Macleod ch. 2).
    expect(row.R).toBeCloseTo(0.012601, 6);
    expect(Object.keys(row)).toEqual(['wavelength_nm', 'angle_deg', 'pol', 'R', 'T', 'A']);
  });

  it('computes the thick substrate with --back incoherent (uncoated plate: 2R/(1 + R))', () => {
    const { stdout } = run(['--stack', 'bare.json', '--wavelengths', '550', '--back', 'incoherent'], {
      'bare.json': '{ "substrate": { "n": 1.52 }, "layers": [] }',
    });
    expect(csvRows(stdout)[0]?.R).toBeCloseTo(0.081682, 6); // Macleod ch. 2: uncoated plate 2R/(1 + R)
  });
});

describe('malformed stack files', () => {
  it.each([
    [
      '{ "substrate": { "n": 1.52 }, "layers": [ { "n": 2.1 } ] }',
      /bad\.json: layers\[0\]: needs a thickness/,
    ],
    [
      '{ "substrate": { "n": 1.52 }, "layers": [ { "n": 2.1, "thickness_nm": -4 } ] }',
      /layers\[0\]\.thickness_nm: must be 0 or more/,
    ],
    [
      '{ "substrate": { "n": "glass" }, "layers": [] }',
      /substrate\.n: must be a finite number \(got "glass"\)/,
    ],
    ['{ "layers": [] }', /bad\.json: substrate: is required/],
    [
      '{ "substrate": { "n": 1.52 }, "layers": [ { "n": 2.1, "thickness_nm": 10, } ] }',
      /bad\.json is not valid JSON/,
    ],
    ['{ "substrate": { "n": 1.52, "k": 1e-6 }, "layers": [] }', /substrate\.thickness_mm: is required/],
  ])('%s', (text, message) => {
    const { code, stdout, stderr } = run(['--stack', 'bad.json', '--back', 'incoherent'], {
      'bad.json': text,
    });
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(message);
  });

  it('names a missing file', () => {
    const { code, stderr } = run(['--stack', '/nonexistent/stack.json']);
    expect(code).toBe(1);
    expect(stderr).toMatch(/cannot read \/nonexistent\/stack\.json/);
  });

  it('reports grid problems against the option that caused them', () => {
    const { code, stderr } = run(['--stack', example, '--angles', '95']);
    expect(code).toBe(2);
    expect(stderr).toMatch(/--angles: angle of incidence must be at least 0° and below 90°/);
  });
});

describe('the real process', () => {
  const exec = promisify(execFile);
  it('`npm run calc` from the project root prints the CSV, and fails with a message for a bad file', async () => {
    const { stdout } = await exec(
      'npm',
      [
        'run',
        'calc',
        '--silent',
        '--',
        '--stack',
        'tools/calc/examples/two-layer.json',
        '--wavelengths',
        '450,550',
        '--angles',
        '0,45',
      ],
      { cwd: root },
    );
    const rows = csvRows(stdout);
    expect(rows).toHaveLength(4);
    expect(rows[0]).toMatchObject({ wl: 450, angle: 0, pol: 'avg' });
    const failure = await exec(
      'npm',
      ['run', 'calc', '--silent', '--', '--stack', 'tools/calc/no-such-file.json'],
      {
        cwd: root,
      },
    ).catch((error: { code: number; stderr: string }) => error);
    expect('code' in failure && failure.code).toBe(1);
    expect((failure as { stderr: string }).stderr).toMatch(/cannot read .*no-such-file\.json/);
  });
});
