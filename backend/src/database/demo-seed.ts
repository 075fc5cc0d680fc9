import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { Role } from '@quietglass/shared';
import { Customer } from '../customers/customer.entity.js';
import { Material } from '../materials/material.entity.js';
import { User } from '../users/user.entity.js';
import { validateSpecMask } from '@quietglass/shared/optics/mask';
import { SpecMaskRecord } from '../spec-masks/spec-mask.entity.js';
import type { ProcessSetting } from '@quietglass/shared/chambers';
import { Chamber } from '../chambers/chamber.entity.js';
import { ChamberProcessSettings } from '../chambers/process-settings.entity.js';
import {
  DEMO_CHAMBERS,
  DEMO_PROCESS_SETTINGS,
  DEMO_CUSTOMERS,
  DEMO_DESIGNS,
  DEMO_MATERIALS,
  DEMO_SPEC_MASKS,
} from './demo-materials.js';
import { Design } from '../designs/design.entity.js';
import { DesignVersion } from '../designs/design-version.entity.js';
import { VersionEvent } from '../designs/version-event.entity.js';
import { hashPassword } from '../users/passwords.js';
import { elementAt } from '@quietglass/shared/checked';

/**
 * The demo shop, an invented scenario: Larkspur Thin Film Works, a small coating shop with one
 * admin, two coating engineers, one salesperson and one chamber operator.
 */
export const DEMO_SHOP = 'Larkspur Thin Film Works';

export const DEMO_USERS: readonly { email: string; displayName: string; role: Role }[] = [
  { email: 'elin.voss@larkspur.example', displayName: 'Elin Voss', role: 'admin' },
  { email: 'mira.castell@larkspur.example', displayName: 'Mira Castell', role: 'engineer' },
  { email: 'tomas.reyes@larkspur.example', displayName: 'Tomas Reyes', role: 'engineer' },
  { email: 'priya.nand@larkspur.example', displayName: 'Priya Nand', role: 'sales' },
  { email: 'jonah.pike@larkspur.example', displayName: 'Jonah Pike', role: 'operator' },
];

export interface DemoSignIn {
  email: string;
  role: Role;
  password: string;
}

/**
 * Demo passwords are generated once per installation and kept in `file` (never in the code), so
 * every shop's demo has its own. Returns the sign-ins, creating the file when missing.
 */
export function demoSignIns(file: string): DemoSignIn[] {
  const known: Record<string, string> = fs.existsSync(file)
    ? Object.fromEntries(
        (JSON.parse(fs.readFileSync(file, 'utf8')) as DemoSignIn[]).map((s) => [s.email, s.password]),
      )
    : {};
  const signIns = DEMO_USERS.map((u) => ({
    email: u.email,
    role: u.role,
    password: known[u.email] ?? `${u.role}-${randomBytes(6).toString('base64url')}`,
  }));
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, JSON.stringify(signIns, null, 2) + '\n', { mode: 0o600 });
  return signIns;
}

/** The name under which the demo shop is recorded in demo_seeds once created. */
const DEMO_SEED = 'larkspur-demo-shop';

/**
 * Creates the demo shop once. Its creation is recorded (demo_seeds), and every later call creates
 * nothing, so records the shop renamed or deleted are never made again. A database that already
 * has the demo users (from before the record existed) counts as seeded. Returns how many records
 * it created.
 */
export async function seedDemo(db: DataSource, signIns: DemoSignIn[]): Promise<number> {
  const [done] = await db.query<unknown[]>('SELECT 1 FROM demo_seeds WHERE name = $1', [DEMO_SEED]);
  if (done) return 0;
  const earlier = await db
    .getRepository(User)
    .existsBy({ email: elementAt(DEMO_USERS, 0, 'the demo users').email });
  const created = earlier ? 0 : await createDemo(db, signIns);
  await db.query('INSERT INTO demo_seeds (name) VALUES ($1) ON CONFLICT DO NOTHING', [DEMO_SEED]);
  return created;
}

/** Creates what of the demo shop does not exist yet (by name), leaving existing records alone. */
async function createDemo(db: DataSource, signIns: DemoSignIn[]): Promise<number> {
  const repo = db.getRepository(User);
  let created = 0;
  for (const customer of DEMO_CUSTOMERS) {
    if (await db.getRepository(Customer).existsBy({ name: customer.name })) continue;
    await db.getRepository(Customer).insert(customer);
    created += 1;
  }
  for (const m of DEMO_MATERIALS) {
    if (await db.getRepository(Material).existsBy({ name: m.name })) continue;
    const content = m.file ? Buffer.from(m.file.text, 'utf8') : null;
    const inserted = await db.getRepository(Material).insert({
      name: m.name,
      model: m.model,
      rangeFromNm: m.rangeNm.from,
      rangeToNm: m.rangeNm.to,
      typical: m.provenanceKind === 'typical',
      provenanceKind: m.provenanceKind,
      source: m.source,
      processNotes: m.processNotes,
      ...(m.file && content
        ? {
            sourceFileName: m.file.fileName,
            sourceFileType: 'application/yaml',
            sourceFileBytes: content.length,
          }
        : {}),
      version: 1,
    });
    if (content) {
      await db.query('INSERT INTO material_source_files (material_id, content) VALUES ($1, $2)', [
        (inserted.identifiers[0] as { id: number }).id,
        content,
      ]);
    }
    created += 1;
  }
  for (const mask of DEMO_SPEC_MASKS) {
    const customer = await db.getRepository(Customer).findOneByOrFail({ name: mask.customer });
    const repo = db.getRepository(SpecMaskRecord);
    if (await repo.existsBy({ name: mask.name, revision: mask.revision, customer: { id: customer.id } }))
      continue;
    const { bands } = validateSpecMask({ bands: mask.bands });
    await repo.insert({
      name: mask.name,
      revision: mask.revision,
      customer,
      bands,
      notes: mask.notes,
      version: 1,
    });
    created += 1;
  }
  for (const chamber of DEMO_CHAMBERS) {
    if (await db.getRepository(Chamber).existsBy({ name: chamber.name })) continue;
    const id = async (name: string) => (await db.getRepository(Material).findOneByOrFail({ name })).id;
    const materials = [];
    for (const [name, toolingFactor, rateNmPerS] of chamber.materials) {
      materials.push({ materialId: await id(name), toolingFactor, rateNmPerS });
    }
    const { identifiers } = await db.getRepository(Chamber).insert({
      name: chamber.name,
      monitorWavelengthsNm: chamber.monitorWavelengthsNm,
      monitorChipMaterialId: await id(chamber.monitorChip),
      materials,
      notes: chamber.notes,
      version: 1,
    });
    const settings: ProcessSetting[] = [];
    for (const [name, temperature, basePressure, o2, ion] of DEMO_PROCESS_SETTINGS[chamber.name] ?? []) {
      settings.push({
        materialId: await id(name),
        substrateTemperatureC: temperature,
        basePressureMbar: basePressure,
        o2FlowSccm: o2,
        o2PartialPressureMbar: null,
        arFlowSccm: null,
        ionVoltageV: ion?.[0] ?? null,
        ionCurrentA: ion?.[1] ?? null,
        ionGasFlowSccm: ion?.[2] ?? null,
        notes: 'demo value',
      });
    }
    if (settings.length > 0) {
      await db.getRepository(ChamberProcessSettings).insert({
        chamberId: Number(elementAt(identifiers, 0, 'the inserted chamber ids').id),
        settings,
        version: 1,
        updatedAt: new Date(),
      });
    }
    created += 1;
  }
  for (const demo of DEMO_USERS) {
    if (await repo.existsBy({ email: demo.email })) continue;
    const password = signIns.find((s) => s.email === demo.email)?.password;
    if (!password) throw new Error(`No demo password for ${demo.email}`);
    await repo.insert({ ...demo, passwordHash: await hashPassword(password), active: true });
    created += 1;
  }
  for (const demo of DEMO_DESIGNS) {
    if (await db.getRepository(Design).existsBy({ name: demo.name })) continue;
    await seedReleasedDesign(db, demo);
    created += 1;
  }
  return created;
}

/** A design whose version 1 went through the whole lifecycle: written, submitted, approved, released. */
async function seedReleasedDesign(db: DataSource, demo: (typeof DEMO_DESIGNS)[number]): Promise<void> {
  await db.transaction(async (tx) => {
    const material = (name: string) => tx.getRepository(Material).findOneByOrFail({ name });
    const customer = await tx.getRepository(Customer).findOneByOrFail({ name: demo.customer });
    const mask = await tx.getRepository(SpecMaskRecord).findOneByOrFail({
      name: demo.mask.name,
      revision: demo.mask.revision,
      customer: { id: customer.id },
    });
    const author = await tx.getRepository(User).findOneByOrFail({ email: demo.author });
    const reviewer = await tx.getRepository(User).findOneByOrFail({ email: demo.reviewer });
    const incident = await material(demo.incident);
    const substrate = await material(demo.substrate);
    const layerMaterials: Material[] = [];
    for (const [name] of demo.layers) layerMaterials.push(await material(name));
    const snapshot = Object.fromEntries(
      [incident, substrate, ...layerMaterials].map((m) => [
        String(m.id),
        { name: m.name, model: m.model, rangeNm: { from: m.rangeFromNm, to: m.rangeToNm } },
      ]),
    );
    const design = await tx
      .getRepository(Design)
      .save(
        tx
          .getRepository(Design)
          .create({ name: demo.name, customer, specMaskId: mask.id, createdBy: author }),
      );
    await tx.getRepository(DesignVersion).insert({
      design,
      designId: design.id,
      number: 1,
      status: 'released',
      incidentMaterialId: incident.id,
      substrateMaterialId: substrate.id,
      substrateThicknessMm: demo.substrateThicknessMm,
      backSurface: 'front-only',
      referenceWavelengthNm: demo.referenceWavelengthNm,
      notes: demo.notes,
      layers: demo.layers.map(([, thicknessNm], i) => ({
        materialId: elementAt(layerMaterials, i, 'the layer materials').id,
        thicknessNm,
        locked: false,
        notes: '',
      })),
      materialsSnapshot: snapshot,
      rowVersion: 4,
      createdBy: author,
    });
    const steps = [
      ['draft', 'submitted', author],
      ['submitted', 'approved', reviewer],
      ['approved', 'released', reviewer],
    ] as const;
    for (const [fromStatus, toStatus, actor] of steps) {
      await tx
        .getRepository(VersionEvent)
        .insert({ designId: design.id, versionNumber: 1, fromStatus, toStatus, actor, comment: '' });
    }
    // What a submit records through the materials and spec-mask services.
    await tx.query(
      `INSERT INTO material_uses (material_id, design_id, version_number)
       SELECT DISTINCT unnest($1::int[]), $2::int, 1 ON CONFLICT DO NOTHING`,
      [[incident, substrate, ...layerMaterials].map((m) => m.id), design.id],
    );
    await tx.query('UPDATE spec_masks SET in_use_since = now() WHERE id = $1', [mask.id]);
  });
}
