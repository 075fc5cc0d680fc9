import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { calculateSpectrum } from '@quietglass/shared/optics/batch';
import { parseStack, type StackDescription } from '@quietglass/shared/optics/stack';
import { Mulberry32, fillDeviates } from '@quietglass/shared/optimise/random';
import { runOptimiseJob, type DiagnosisInput } from '../calculations/optimise-jobs.js';
import { Chamber } from '../chambers/chamber.entity.js';
import { Design } from '../designs/design.entity.js';
import { DesignVersion } from '../designs/design-version.entity.js';
import { Material } from '../materials/material.entity.js';
import { ChamberRun, RunSpectrum } from '../runs/run.entity.js';
import { User } from '../users/user.entity.js';
import { elementAt } from '@quietglass/shared/checked';
import { keptToolingFactors } from '@quietglass/shared/chambers';

/** Recorded in demo_seeds once the history exists. */
const CALIBRATION_SEED = 'larkspur-calibration-history';
const RUNS = 12;
const WAVELENGTHS = Array.from({ length: 101 }, (_, i) => 400 + 4 * i);
const ANGLE_DEG = 8;

/**
 * The demo chamber's calibration history, an invented scenario: twelve lots of the HVS-2210 AR on
 * Box coater B2 over October and November 2026, each with its witness reflectance and a completed
 * Run diagnosis. ZrO2 drifts slowly thick (0 → +2 % over the twelve runs, as a source crucible
 * wears); every material has 0.3 % run-to-run scatter and the spectra 0.03 % measurement noise.
 * The spectra are computed with the optics engine and diagnosed with the real Run diagnosis, so the
 * Chambers page shows a control chart and a suggestion after `npm start`. Created once (recorded in
 * demo_seeds); returns how many runs it created.
 */
export async function seedCalibrationDemo(db: DataSource): Promise<number> {
  const [done] = await db.query<unknown[]>('SELECT 1 FROM demo_seeds WHERE name = $1', [CALIBRATION_SEED]);
  if (done) return 0;
  const chamber = await db.getRepository(Chamber).findOneBy({ name: 'Box coater B2' });
  const design = await db.getRepository(Design).findOneBy({ name: 'HVS-2210 four-layer AR' });
  const operator = await db.getRepository(User).findOneBy({ email: 'jonah.pike@larkspur.example' });
  const engineer = await db.getRepository(User).findOneBy({ email: 'mira.castell@larkspur.example' });
  if (!chamber || !design || !operator || !engineer) return 0;
  if (await db.getRepository(ChamberRun).existsBy({ chamberId: chamber.id })) return 0;
  const version = await db.getRepository(DesignVersion).findOneByOrFail({ designId: design.id, number: 1 });
  const materials = new Map((await db.getRepository(Material).find()).map((m) => [m.id, m]));
  const model = (id: number) => materials.get(id)!.model;
  const zro2 = [...materials.values()].find((m) => m.name === 'ZrO2')!.id;
  const description = (factors: number[]): StackDescription => ({
    incident: { material: model(version.incidentMaterialId) },
    substrate: { material: model(version.substrateMaterialId) },
    layers: version.layers.map((l, i) => ({
      material: model(l.materialId),
      thickness_nm: l.thicknessNm * elementAt(factors, i, 'the layer factors'),
    })),
  });
  const setting = new Map(chamber.materials.map((m) => [m.materialId, m]));
  const count = version.layers.length;
  const scatter = fillDeviates(new Float64Array(RUNS * 16), RUNS * 16, new Mulberry32(2210), 'normal');
  const noise = fillDeviates(
    new Float64Array(RUNS * WAVELENGTHS.length),
    RUNS * WAVELENGTHS.length,
    new Mulberry32(2211),
    'normal',
  );
  for (let k = 0; k < RUNS; k++) {
    const runDate = new Date(Date.UTC(2026, 9, 2 + 5 * k));
    const byMaterial = new Map<number, number>();
    version.layers.forEach((l, i) => {
      if (byMaterial.has(l.materialId)) return;
      const drift = l.materialId === zro2 ? (0.02 * k) / (RUNS - 1) : 0;
      byMaterial.set(l.materialId, (1 + drift) * (1 + 0.003 * elementAt(scatter, k * 16 + i, 'the scatter')));
    });
    const factors = version.layers.map((l) => byMaterial.get(l.materialId)!);
    const R = calculateSpectrum(parseStack(description(factors)), {
      wavelengthsNm: WAVELENGTHS,
      anglesDeg: [ANGLE_DEG],
      polarisations: ['avg'],
    }).R;
    const values = WAVELENGTHS.map((_, i) =>
      Number(
        Math.max(
          0,
          100 * elementAt(R, i, 'the spectrum') +
            0.03 * elementAt(noise, k * WAVELENGTHS.length + i, 'the noise'),
        ).toFixed(4),
      ),
    );
    const lot = `B2-26${String(101 + k)}`;
    const csv = ['wavelength_nm,R_percent', ...WAVELENGTHS.map((w, i) => `${w},${values[i]}`)].join('\n');
    // The operator hit the sheet's monitor targets and logged the crystal rate of each step.
    const layerReadings = version.layers.map((l, i) => {
      const s = setting.get(l.materialId)!;
      return {
        step: count - i,
        monitorThicknessNm: Number((l.thicknessNm / s.toolingFactor).toFixed(1)),
        rateNmPerS: Number(
          (s.rateNmPerS * (1 + 0.02 * elementAt(scatter, k * 16 + 8 + i, 'the scatter'))).toFixed(3),
        ),
      };
    });
    const input: DiagnosisInput = {
      kind: 'diagnosis',
      stack: description(version.layers.map(() => 1)),
      back: 'none',
      bands: [{ from_nm: 400, to_nm: 800, quantity: 'R', max_percent: 100, weight: 1, step_nm: 400 }],
      layerMaterialIds: version.layers.map((l) => l.materialId),
      measured: { quantity: 'R', angleDeg: ANGLE_DEG, wavelengthsNm: WAVELENGTHS, valuesPercent: values },
      factorRange: [0.7, 1.3],
    };
    const started = Date.now();
    const result = runOptimiseJob(input, () => true);
    const computeMs = Date.now() - started;
    await db.transaction(async (tx) => {
      const run = await tx.getRepository(ChamberRun).save(
        tx.getRepository(ChamberRun).create({
          designId: design.id,
          versionNumber: 1,
          chamberId: chamber.id,
          lotNumber: lot,
          runDate: runDate.toISOString().slice(0, 10),
          operator,
          layerReadings: layerReadings.sort((a, b) => a.step - b.step),
          durability: [],
          notes: 'Demo run (invented)',
          remarks: [],
          toolingFactors: keptToolingFactors(chamber.materials),
          createdAt: runDate,
        }),
      );
      await tx.getRepository(RunSpectrum).save(
        tx.getRepository(RunSpectrum).create({
          runId: run.id,
          quantity: 'R',
          angleDeg: ANGLE_DEG,
          sample: 'witness',
          filename: `${lot}-witness.csv`,
          originalText: csv,
          wavelengthsNm: WAVELENGTHS,
          valuesPercent: values,
          uploadedBy: operator,
        }),
      );
      const json = JSON.stringify(input);
      await tx.query(
        `INSERT INTO calculations (kind, input_hash, input, status, progress, summary, design_id, version_number,
           run_id, created_by, created_at, started_at, finished_at, compute_ms, processed_by, completed_count, attempts)
         VALUES ('diagnosis', $1, $2, 'completed', 1, $3, $4, 1, $5, $6, $7, $7, $7, $8, 'demo seed', 1, 1)`,
        [
          createHash('sha256').update(json).digest('hex'),
          json,
          JSON.stringify(result),
          design.id,
          run.id,
          engineer.id,
          runDate,
          computeMs,
        ],
      );
    });
  }
  await db.query('INSERT INTO demo_seeds (name) VALUES ($1) ON CONFLICT DO NOTHING', [CALIBRATION_SEED]);
  return RUNS;
}
