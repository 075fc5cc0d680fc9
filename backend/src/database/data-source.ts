import 'reflect-metadata';
import { DataSource, type DataSourceOptions } from 'typeorm';
import { AuditEvent } from '../audit/audit-event.entity.js';
import { Calculation } from '../calculations/calculation.entity.js';
import { CalibrationDecision, CalibrationSettingsRecord } from '../calibration/calibration.entity.js';
import { Chamber } from '../chambers/chamber.entity.js';
import { ShopSettings } from '../shop-settings/shop-settings.entity.js';
import { ChamberProcessSettings } from '../chambers/process-settings.entity.js';
import { Customer } from '../customers/customer.entity.js';
import { Design } from '../designs/design.entity.js';
import { DesignVersion } from '../designs/design-version.entity.js';
import { VersionEvent } from '../designs/version-event.entity.js';
import { OutboxAttachment, OutboxMessage } from '../mail/outbox.entity.js';
import { Material, MaterialRevision } from '../materials/material.entity.js';
import { Quote } from '../quotes/quote.entity.js';
import { ComplianceReport } from '../reports/report.entity.js';
import { ChamberRun, RunSpectrum } from '../runs/run.entity.js';
import { SpecMaskRecord } from '../spec-masks/spec-mask.entity.js';
import { Session } from '../sessions/session.entity.js';
import { RedactingDbLogger } from './db-logger.js';
import { User } from '../users/user.entity.js';
import { CreateUsers1764633600000 } from '../migrations/1764633600000-create-users.js';
import { CustomersMaterials1764633700000 } from '../migrations/1764633700000-customers-materials.js';
import { SpecMasksDesigns1764633800000 } from '../migrations/1764633800000-spec-masks-designs.js';
import { Calculations1764633900000 } from '../migrations/1764633900000-calculations.js';
import { VersionEvents1764634000000 } from '../migrations/1764634000000-version-events.js';
import { Chambers1764634100000 } from '../migrations/1764634100000-chambers.js';
import { ChamberRuns1764634200000 } from '../migrations/1764634200000-chamber-runs.js';
import { ReportsQuotesOutbox1764634300000 } from '../migrations/1764634300000-reports-quotes-outbox.js';
import { CalculationLive1764634400000 } from '../migrations/1764634400000-calculation-live.js';
import { AuditTrailRevisions1764634500000 } from '../migrations/1764634500000-audit-trail-revisions.js';
import { DemoSeeds1764634600000 } from '../migrations/1764634600000-demo-seeds.js';
import { Sessions1764634700000 } from '../migrations/1764634700000-sessions.js';
import { MaterialRevisions1764634800000 } from '../migrations/1764634800000-material-revisions.js';
import { RecordUses1764700000000 } from '../migrations/1764700000000-record-uses.js';
import { CustomerRecordsMaskKinds1764810000000 } from '../migrations/1764810000000-customer-records-mask-kinds.js';
import { MaterialProvenanceFiles1764820000000 } from '../migrations/1764820000000-material-provenance-files.js';
import { ChamberCalibration1764840000000 } from '../migrations/1764840000000-chamber-calibration.js';
import { ShopTargetMargin1764910000000 } from '../migrations/1764910000000-shop-target-margin.js';
import { RunToolingFactors1764920000000 } from '../migrations/1764920000000-run-tooling-factors.js';
import { UserVersion1764930000000 } from '../migrations/1764930000000-user-version.js';
import { ChamberProcessShopSettings1764830000000 } from '../migrations/1764830000000-chamber-process-shop-settings.js';

/** Every entity of the app; each domain module also registers its own with forFeature. */
export const ENTITIES = [
  User,
  Customer,
  Material,
  MaterialRevision,
  SpecMaskRecord,
  Design,
  DesignVersion,
  VersionEvent,
  Calculation,
  Chamber,
  ChamberProcessSettings,
  ChamberRun,
  RunSpectrum,
  ComplianceReport,
  Quote,
  OutboxMessage,
  OutboxAttachment,
  Session,
  AuditEvent,
  CalibrationDecision,
  CalibrationSettingsRecord,
  ShopSettings,
];

/** Every migration, in order. Listed explicitly so the same list works from src (tests) and dist. */
export const MIGRATIONS = [
  CreateUsers1764633600000,
  CustomersMaterials1764633700000,
  SpecMasksDesigns1764633800000,
  Calculations1764633900000,
  VersionEvents1764634000000,
  Chambers1764634100000,
  ChamberRuns1764634200000,
  ReportsQuotesOutbox1764634300000,
  CalculationLive1764634400000,
  AuditTrailRevisions1764634500000,
  DemoSeeds1764634600000,
  Sessions1764634700000,
  MaterialRevisions1764634800000,
  RecordUses1764700000000,
  CustomerRecordsMaskKinds1764810000000,
  MaterialProvenanceFiles1764820000000,
  ChamberProcessShopSettings1764830000000,
  ChamberCalibration1764840000000,
  ShopTargetMargin1764910000000,
  RunToolingFactors1764920000000,
  UserVersion1764930000000,
];

/** TypeORM options for PostgreSQL; never `synchronize` — the schema comes from migrations. */
export function dataSourceOptions(databaseUrl: string): DataSourceOptions {
  return {
    type: 'postgres',
    url: databaseUrl,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsTableName: 'schema_migrations',
    synchronize: false,
    migrationsRun: false,
    logging: ['error', 'warn'],
    logger: new RedactingDbLogger(),
  };
}

/** A DataSource for the TypeORM CLI and scripts (reads DATABASE_URL). */
export default new DataSource(
  dataSourceOptions(process.env.DATABASE_URL ?? 'postgres://localhost/quietglass'),
);
