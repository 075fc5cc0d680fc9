import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_TARGET_MARGIN_PERCENT, ROLES, type Role } from '@quietglass/shared';
import { binary } from './support/binary.js';
import { createTestApp, sessionCookie } from './support/app.js';
import { demoSignIn } from './support/env.js';
import { materialIds, twoLayerDesign, versionContent } from './support/fixtures.js';
import { solidPng } from './support/png.js';

/**
 * Every API route, who may use it, and what a permitted call returns. A route missing here fails
 * the completeness check below, so no route can ship without its role rule being tested.
 */
interface RouteRule {
  method: 'get' | 'post' | 'patch' | 'delete' | 'put';
  path: string;
  /** 'public' routes need no session; otherwise the roles allowed. */
  allow: 'public' | readonly Role[];
  okStatus: number;
  /** Request for a permitted caller; gets a context with ids made in beforeAll. */
  body?: (ctx: MatrixContext, role: Role | 'anonymous') => object;
  /** Concrete path (for :id routes). */
  url?: (ctx: MatrixContext, role: Role | 'anonymous') => string;
  /** A download streamed in full (e.g. the database archive): the body is read to the end. */
  download?: true;
  /** Keeps the context in step after a permitted call (e.g. a new row version). */
  after?: (ctx: MatrixContext, body: { version?: number; rowVersion?: number }) => void;
}

interface MatrixContext {
  targetUserId: number;
  targetUserVersion: number;
  materialId: number;
  materialVersion: number;
  customerId: number;
  designId: number;
  designVersion: number;
  customerVersion: number;
  maskRevision: string;
  maskId: number;
  maskVersion: number;
  doneCalcId: number;
  fitCalcId: number;
  cancelCalcIds: Partial<Record<Role | 'anonymous', number>>;
  /** Per permitted role, a calculation of that role's own matrix user, to delete. */
  deleteCalcIds: Partial<Record<Role | 'anonymous', number>>;
  draftRowVersion: number;
  /** Per action, one design per permitted role, already in the state the action starts from. */
  stage: Record<
    'submit' | 'approve' | 'return' | 'release' | 'retire',
    Partial<Record<Role | 'anonymous', number>>
  >;
  releasedDesignId: number;
  chamberId: number;
  chamberVersion: number;
  calibrationSettingsVersion: number;
  processVersion: number;
  shopVersion: number;
  runId: number;
  /** Per permitted role, a run its own matrix user logged (only a run's operator may change it). */
  ownRunIds: Partial<Record<Role | 'anonymous', number>>;
  spectrumId: number;
  reportId: number;
  quoteId: number;
  quoteVersion: number;
  sendQuoteIds: Partial<Record<Role | 'anonymous', number>>;
  /** Per permitted role, a customer of its own to archive and then restore, and its version. */
  archiveCustomers: Partial<Record<Role | 'anonymous', { id: number; version: number }>>;
  /** Per permitted role, a material of its own to retire and then restore, and its version. */
  retireMaterials: Partial<Record<Role | 'anonymous', { id: number; version: number }>>;
  sentQuoteIds: Partial<Record<Role | 'anonymous', number>>;
  outboxId: number;
  attachmentId: number;
  materialIdsByName: Record<string, number>;
  design: ReturnType<typeof twoLayerDesign>;
  passwords: Record<Role, string>;
  counter: number;
}

const ALL: readonly Role[] = ROLES;
const DESIGNERS: readonly Role[] = ['admin', 'engineer'];
const OFFICE: readonly Role[] = ['admin', 'engineer', 'sales'];
const FLOOR: readonly Role[] = ['admin', 'engineer', 'operator'];
const SELLERS: readonly Role[] = ['admin', 'sales'];
const inDays = (d: number) => new Date(Date.now() + d * 86_400_000).toISOString().slice(0, 10);
const quoteBody = (ctx: MatrixContext) => ({
  customerId: ctx.customerId,
  contactEmail: 'buyer@matrix.example',
  designId: ctx.releasedDesignId,
  versionNumber: 1,
  specMaskId: ctx.maskId,
  partDescription: 'Matrix part',
  quantityBreaks: [{ minQuantity: 1, unitPrice: 10 }],
  currency: 'EUR',
  leadTimeDays: 10,
  validUntil: inDays(30),
});
const chamberBody = (ctx: MatrixContext) => ({
  name: 'Matrix chamber',
  monitorWavelengthsNm: [550],
  monitorChipMaterialId: ctx.materialIdsByName['Fused silica'],
  materials: ['MgF2', 'ZrO2'].map((n) => ({
    materialId: ctx.materialIdsByName[n],
    toolingFactor: 1,
    rateNmPerS: 0.5,
  })),
});
const maskBody = (ctx: MatrixContext) => ({
  name: 'Matrix mask',
  customerId: ctx.customerId,
  revision: 'A',
  bands: [{ from_nm: 400, to_nm: 700, quantity: 'R', max_percent: 1 }],
});
/** A published optical-constants file in its own format (excerpt; values invented for the matrix). */
const CONSTANTS_FILE = `REFERENCES: |
    Matrix test reference (invented).
DATA:
  - type: tabulated n
    data: |
        0.40 1.50
        0.80 1.45
`;
const materialBody = (name: string) => ({
  name,
  model: { model: 'constant', n: 1.9, k: 0 },
  rangeNm: { from: 400, to: 900 },
  typical: true,
  provenance: { source: 'matrix test value' },
});

const RULES: RouteRule[] = [
  // No worker runs beside this file, so the report is degraded: 503 (health.e2e-spec checks 200).
  { method: 'get', path: '/api/health', allow: 'public', okStatus: 503 },
  {
    method: 'post',
    path: '/api/auth/sign-in',
    allow: 'public',
    okStatus: 200,
    body: () => ({ email: demoSignIn('sales').email, password: demoSignIn('sales').password }),
  },
  { method: 'get', path: '/api/auth/session', allow: 'public', okStatus: 200 },
  { method: 'get', path: '/api/auth/me', allow: ALL, okStatus: 200 },
  {
    method: 'post',
    path: '/api/auth/password',
    allow: ALL,
    okStatus: 204,
    body: (ctx, role) => {
      if (role === 'anonymous') return { currentPassword: 'x', newPassword: 'long-enough-password' };
      const current = ctx.passwords[role];
      ctx.passwords[role] = `${current}-next`;
      return { currentPassword: current, newPassword: ctx.passwords[role] };
    },
  },
  { method: 'get', path: '/api/users', allow: ['admin'], okStatus: 200 },
  {
    method: 'post',
    path: '/api/users',
    allow: ['admin'],
    okStatus: 201,
    body: (ctx) => ({
      email: `matrix-new-${(ctx.counter += 1)}@larkspur.example`,
      displayName: 'Matrix New',
      role: 'sales',
      password: 'long-enough-password',
    }),
  },
  {
    method: 'patch',
    path: '/api/users/:id',
    allow: ['admin'],
    okStatus: 200,
    url: (ctx) => `/api/users/${ctx.targetUserId}`,
    body: (ctx) => ({ displayName: 'Matrix Target Renamed', version: ctx.targetUserVersion }),
    after: (ctx, body) => {
      ctx.targetUserVersion = body.version ?? ctx.targetUserVersion;
    },
  },
  {
    method: 'post',
    path: '/api/users/:id/password',
    allow: ['admin'],
    okStatus: 204,
    url: (ctx) => `/api/users/${ctx.targetUserId}/password`,
    body: () => ({ newPassword: 'another-long-password' }),
  },
  { method: 'get', path: '/api/materials', allow: ALL, okStatus: 200 },
  {
    method: 'get',
    path: '/api/materials/:id',
    allow: ALL,
    okStatus: 200,
    url: (ctx) => `/api/materials/${ctx.materialId}`,
  },
  {
    method: 'get',
    path: '/api/materials/:id/revisions',
    allow: ALL,
    okStatus: 200,
    url: (ctx) => `/api/materials/${ctx.materialId}/revisions`,
  },
  {
    method: 'post',
    path: '/api/materials',
    allow: DESIGNERS,
    okStatus: 201,
    body: (ctx) => materialBody(`Matrix material ${(ctx.counter += 1)}`),
  },
  {
    method: 'put',
    path: '/api/materials/:id',
    allow: DESIGNERS,
    okStatus: 200,
    url: (ctx) => `/api/materials/${ctx.materialId}`,
    body: (ctx) => ({ ...materialBody('Matrix material'), version: ctx.materialVersion }),
    after: (ctx, body) => {
      ctx.materialVersion = body.version ?? ctx.materialVersion;
    },
  },
  {
    method: 'post',
    path: '/api/materials/import-csv',
    allow: DESIGNERS,
    okStatus: 201,
    body: (ctx) => ({
      name: `Matrix table ${(ctx.counter += 1)}`,
      unit: 'nm',
      csv: 'wavelength_nm,n,k\n400,1.5,0\n800,1.45,0\n',
      typical: true,
    }),
  },
  {
    method: 'post',
    path: '/api/materials/import-csv/preview',
    allow: DESIGNERS,
    okStatus: 200,
    body: () => ({ csv: 'Wavelength (nm);n;k\n400;1,5;0\n800;1,45;0\n' }),
  },
  {
    method: 'post',
    path: '/api/materials/import-constants',
    allow: DESIGNERS,
    okStatus: 201,
    body: (ctx) => ({
      name: `Matrix constants ${(ctx.counter += 1)}`,
      text: CONSTANTS_FILE,
      fileName: 'matrix.yml',
    }),
  },
  {
    method: 'get',
    path: '/api/materials/:id/source-file',
    allow: ALL,
    okStatus: 200,
    download: true,
    url: (ctx) => `/api/materials/${ctx.materialIdsByName.SiO2}/source-file`,
  },
  ...(['retire', 'restore'] as const).map((action): RouteRule => ({
    method: 'post',
    path: `/api/materials/:id/${action}`,
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx, role) => `/api/materials/${ctx.retireMaterials[role]?.id ?? ctx.materialId}/${action}`,
    body: (ctx, role) => ({ version: ctx.retireMaterials[role]?.version ?? 1 }),
    after: (ctx, body) => {
      const saved = body as { id?: number; version?: number };
      for (const own of Object.values(ctx.retireMaterials))
        if (own && own.id === saved.id) own.version = saved.version ?? own.version;
    },
  })),
  { method: 'get', path: '/api/designs', allow: OFFICE, okStatus: 200 },
  { method: 'post', path: '/api/designs', allow: DESIGNERS, okStatus: 201, body: (ctx) => ctx.design },
  {
    method: 'get',
    path: '/api/designs/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}`,
  },
  {
    method: 'patch',
    path: '/api/designs/:id',
    allow: DESIGNERS,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}`,
    body: (ctx) => ({ name: 'Matrix design renamed', version: ctx.designVersion }),
    after: (ctx, body) => {
      ctx.designVersion = body.version ?? ctx.designVersion;
    },
  },
  {
    method: 'get',
    path: '/api/designs/:id/versions/:number',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}/versions/1`,
  },
  {
    method: 'put',
    path: '/api/designs/:id/versions/:number',
    allow: DESIGNERS,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}/versions/1`,
    body: (ctx) => ({ ...versionContent(ctx.design), rowVersion: ctx.draftRowVersion }),
    after: (ctx, body) => {
      ctx.draftRowVersion = body.rowVersion ?? ctx.draftRowVersion;
    },
  },
  {
    method: 'post',
    path: '/api/designs/:id/versions',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx) => `/api/designs/${ctx.designId}/versions`,
    body: () => ({ fromNumber: 1 }),
  },
  {
    method: 'post',
    path: '/api/designs/:id/versions/:number/submit',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx, role) => `/api/designs/${ctx.stage.submit[role] ?? ctx.designId}/versions/1/submit`,
    body: () => ({ rowVersion: 1 }),
  },
  ...(['approve', 'return', 'release', 'retire'] as const).map((action): RouteRule => ({
    method: 'post',
    path: `/api/designs/:id/versions/:number/${action}`,
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx, role) => `/api/designs/${ctx.stage[action][role] ?? ctx.designId}/versions/1/${action}`,
    body: () => ({ comment: 'matrix review' }),
  })),
  {
    method: 'get',
    path: '/api/designs/:id/history',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}/history`,
  },
  { method: 'get', path: '/api/audit', allow: ['admin'], okStatus: 200 },
  { method: 'get', path: '/api/audit/export.csv', allow: ['admin'], okStatus: 200 },
  { method: 'get', path: '/api/recipes', allow: FLOOR, okStatus: 200 },
  {
    method: 'get',
    path: '/api/recipes/:id/:number',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/recipes/${ctx.releasedDesignId}/1`,
  },
  { method: 'get', path: '/api/spec-masks', allow: OFFICE, okStatus: 200 },
  {
    method: 'get',
    path: '/api/spec-masks/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/spec-masks/${ctx.maskId}`,
  },
  {
    method: 'get',
    path: '/api/spec-masks/:id/csv',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/spec-masks/${ctx.maskId}/csv`,
  },
  {
    method: 'post',
    path: '/api/spec-masks',
    allow: OFFICE,
    okStatus: 201,
    body: (ctx) => ({ ...maskBody(ctx), revision: `M${(ctx.counter += 1)}` }),
  },
  {
    method: 'put',
    path: '/api/spec-masks/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/spec-masks/${ctx.maskId}`,
    body: (ctx) => ({ ...maskBody(ctx), revision: ctx.maskRevision, version: ctx.maskVersion }),
    after: (ctx, body) => {
      // A mask in use is revised: the edit answers with its next revision, which later edits change.
      const mask = body as { id?: number; version?: number; revision?: string };
      ctx.maskId = mask.id ?? ctx.maskId;
      ctx.maskVersion = mask.version ?? ctx.maskVersion;
      ctx.maskRevision = mask.revision ?? ctx.maskRevision;
    },
  },
  {
    method: 'post',
    path: '/api/spec-masks/import-csv',
    allow: OFFICE,
    okStatus: 201,
    body: (ctx) => ({
      name: 'Matrix mask',
      customerId: ctx.customerId,
      revision: `C${(ctx.counter += 1)}`,
      csv: 'from_nm,to_nm,quantity,max_percent\n400,700,R,1\n',
    }),
  },
  {
    method: 'post',
    path: '/api/designs/:id/versions/:number/analysis',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx) => `/api/designs/${ctx.designId}/versions/1/analysis`,
    body: (ctx) => ({
      fromNm: 400,
      toNm: 700,
      wavelengthCount: 3 + (ctx.counter += 1),
      angleFromDeg: 0,
      angleToDeg: 0,
      angleCount: 1,
    }),
  },
  { method: 'get', path: '/api/calculations', allow: DESIGNERS, okStatus: 200 },
  ...(['fit', 'grow', 'yield'] as const).map((kind): RouteRule => ({
    method: 'post',
    path: `/api/designs/:id/versions/:number/${kind}`,
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx) => `/api/designs/${ctx.designId}/versions/1/${kind}`,
    body: (ctx) => {
      const n = (ctx.counter += 1);
      if (kind === 'fit') return { specMaskId: ctx.maskId, maxIterations: n };
      if (kind === 'grow')
        return { specMaskId: ctx.maskId, allowedMaterialIds: [ctx.materialIdsByName['SiO2']], maxLayers: n };
      return { specMaskId: ctx.maskId, trials: n, thickness: { relativePercent: 1 } };
    },
  })),
  {
    method: 'post',
    path: '/api/runs/:id/spectra/:sid/diagnosis',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx) => `/api/runs/${ctx.runId}/spectra/${ctx.spectrumId}/diagnosis`,
    body: (ctx) => ({ factorRange: [0.7, 1.3 + (ctx.counter += 1) / 100] }),
  },
  {
    method: 'post',
    path: '/api/calculations/:id/accept',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx) => `/api/calculations/${ctx.fitCalcId}/accept`,
  },
  {
    method: 'get',
    path: '/api/calculations/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/calculations/${ctx.doneCalcId}`,
  },
  {
    method: 'get',
    path: '/api/calculations/:id/result',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/calculations/${ctx.doneCalcId}/result?quantity=T&polarisation=s`,
  },
  {
    method: 'get',
    path: '/api/designs/:id/versions/:number/calculations/latest',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/designs/${ctx.designId}/versions/1/calculations/latest`,
  },
  {
    method: 'get',
    path: '/api/runs/:id/diagnosis/latest',
    allow: ['admin', 'engineer', 'operator'],
    okStatus: 200,
    url: (ctx) => `/api/runs/${ctx.runId}/diagnosis/latest`,
  },
  {
    method: 'get',
    path: '/api/calculations/:id/result.csv',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/calculations/${ctx.doneCalcId}/result.csv`,
  },
  {
    method: 'post',
    path: '/api/calculations/:id/cancel',
    allow: DESIGNERS,
    okStatus: 201,
    url: (ctx, role) => `/api/calculations/${ctx.cancelCalcIds[role] ?? ctx.doneCalcId}/cancel`,
  },
  {
    method: 'delete',
    path: '/api/calculations/:id',
    allow: DESIGNERS,
    okStatus: 204,
    url: (ctx, role) => `/api/calculations/${ctx.deleteCalcIds[role] ?? ctx.doneCalcId}`,
  },
  { method: 'get', path: '/api/backup', allow: ['admin'], okStatus: 200, download: true },
  { method: 'get', path: '/api/chambers', allow: FLOOR, okStatus: 200 },
  {
    method: 'get',
    path: '/api/chambers/:id',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/chambers/${ctx.chamberId}`,
  },
  {
    method: 'post',
    path: '/api/chambers',
    allow: DESIGNERS,
    okStatus: 201,
    body: (ctx) => ({ ...chamberBody(ctx), name: `Matrix chamber ${(ctx.counter += 1)}` }),
  },
  {
    method: 'put',
    path: '/api/chambers/:id',
    allow: DESIGNERS,
    okStatus: 200,
    url: (ctx) => `/api/chambers/${ctx.chamberId}`,
    body: (ctx) => ({ ...chamberBody(ctx), version: ctx.chamberVersion }),
    after: (ctx, body) => {
      ctx.chamberVersion = body.version ?? ctx.chamberVersion;
    },
  },
  {
    method: 'get',
    path: '/api/chambers/:id/calibration',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/chambers/${ctx.chamberId}/calibration`,
  },
  {
    // The matrix chamber has no suggestion: a permitted caller gets past the role check to the 409.
    method: 'post',
    path: '/api/chambers/:id/calibration/decisions',
    allow: DESIGNERS,
    okStatus: 409,
    url: (ctx) => `/api/chambers/${ctx.chamberId}/calibration/decisions`,
    body: () => ({ key: 'material|0|run0|tf1->1', decision: 'rejected', comment: 'matrix' }),
  },
  { method: 'get', path: '/api/calibration/settings', allow: FLOOR, okStatus: 200 },
  {
    method: 'put',
    path: '/api/calibration/settings',
    allow: ['admin'],
    okStatus: 200,
    body: (ctx) => ({ thresholdPercent: 1, minRuns: 4, version: ctx.calibrationSettingsVersion }),
    after: (ctx, body) => {
      ctx.calibrationSettingsVersion = body.version ?? ctx.calibrationSettingsVersion;
    },
  },
  {
    method: 'get',
    path: '/api/chambers/:id/process-settings',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/chambers/${ctx.chamberId}/process-settings`,
  },
  {
    method: 'put',
    path: '/api/chambers/:id/process-settings',
    allow: DESIGNERS,
    okStatus: 200,
    url: (ctx) => `/api/chambers/${ctx.chamberId}/process-settings`,
    body: (ctx) => ({
      settings: [
        { materialId: ctx.materialIdsByName['MgF2'], substrateTemperatureC: 250, basePressureMbar: 2e-5 },
      ],
      version: ctx.processVersion,
    }),
    after: (ctx, body) => {
      ctx.processVersion = body.version ?? ctx.processVersion;
    },
  },
  { method: 'get', path: '/api/shop-settings', allow: ALL, okStatus: 200 },
  {
    method: 'put',
    path: '/api/shop-settings',
    allow: ['admin'],
    okStatus: 200,
    // The demo name again: other files print it on their documents.
    body: (ctx) => ({ shopName: 'Larkspur Thin Film Works', version: ctx.shopVersion }),
    after: (ctx, body) => {
      ctx.shopVersion = body.version ?? ctx.shopVersion;
    },
  },
  {
    method: 'put',
    path: '/api/shop-settings/target-margin',
    allow: ['admin'],
    okStatus: 200,
    // The engine's default again: other files design in it.
    body: (ctx) => ({ targetMarginPercent: DEFAULT_TARGET_MARGIN_PERCENT, version: ctx.shopVersion }),
    after: (ctx, body) => {
      ctx.shopVersion = body.version ?? ctx.shopVersion;
    },
  },
  { method: 'get', path: '/api/shop-settings/logo', allow: ALL, okStatus: 200, download: true },
  {
    method: 'put',
    path: '/api/shop-settings/logo',
    allow: ['admin'],
    okStatus: 200,
    body: (ctx) => ({
      contentType: 'image/png',
      dataBase64: solidPng(30, 10).toString('base64'),
      version: ctx.shopVersion,
    }),
    after: (ctx, body) => {
      ctx.shopVersion = body.version ?? ctx.shopVersion;
    },
  },
  {
    method: 'delete',
    path: '/api/shop-settings/logo',
    allow: ['admin'],
    okStatus: 200,
    url: (ctx) => `/api/shop-settings/logo?version=${ctx.shopVersion}`,
    after: (ctx, body) => {
      ctx.shopVersion = body.version ?? ctx.shopVersion;
    },
  },
  {
    method: 'get',
    path: '/api/recipes/:id/:number/run-sheet',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/recipes/${ctx.releasedDesignId}/1/run-sheet?chamberId=${ctx.chamberId}`,
  },
  {
    method: 'get',
    path: '/api/recipes/:id/:number/run-sheet.pdf',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/recipes/${ctx.releasedDesignId}/1/run-sheet.pdf?chamberId=${ctx.chamberId}`,
  },
  { method: 'get', path: '/api/runs', allow: FLOOR, okStatus: 200 },
  {
    method: 'post',
    path: '/api/runs',
    allow: FLOOR,
    okStatus: 201,
    body: (ctx) => ({
      designId: ctx.releasedDesignId,
      versionNumber: 1,
      chamberId: ctx.chamberId,
      lotNumber: 'M-1',
      runDate: '2026-12-01',
    }),
  },
  {
    method: 'get',
    path: '/api/runs/:id',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/runs/${ctx.runId}`,
  },
  {
    method: 'put',
    path: '/api/runs/:id',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx, role) => `/api/runs/${ctx.ownRunIds[role] ?? ctx.runId}`,
    body: () => ({ version: 1, notes: 'matrix' }),
  },
  {
    method: 'post',
    path: '/api/runs/:id/remarks',
    allow: FLOOR,
    okStatus: 201,
    url: (ctx) => `/api/runs/${ctx.runId}/remarks`,
    body: (_ctx, role) => ({ text: `remark by ${role}` }),
  },
  {
    method: 'post',
    path: '/api/runs/:id/spectra',
    allow: FLOOR,
    okStatus: 201,
    url: (ctx) => `/api/runs/${ctx.runId}/spectra`,
    body: () => ({
      filename: 'm.csv',
      csv: 'wavelength_nm,R_percent\n420,0.3\n680,0.4\n',
      angleDeg: 8,
      sample: 'witness',
    }),
  },
  {
    method: 'get',
    path: '/api/runs/:id/spectra/:sid/original',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/runs/${ctx.runId}/spectra/${ctx.spectrumId}/original`,
  },
  {
    method: 'get',
    path: '/api/runs/:id/spectra/:sid/comparison',
    allow: FLOOR,
    okStatus: 200,
    url: (ctx) => `/api/runs/${ctx.runId}/spectra/${ctx.spectrumId}/comparison`,
  },
  { method: 'get', path: '/api/reports', allow: OFFICE, okStatus: 200 },
  {
    method: 'post',
    path: '/api/reports',
    allow: OFFICE,
    okStatus: 201,
    body: (ctx) => ({
      designId: ctx.releasedDesignId,
      versionNumber: 1,
      specMaskId: ctx.maskId,
      hideLayers: true,
    }),
  },
  {
    method: 'get',
    path: '/api/reports/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/reports/${ctx.reportId}`,
  },
  {
    method: 'get',
    path: '/api/reports/:id/pdf',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/reports/${ctx.reportId}/pdf`,
  },
  { method: 'get', path: '/api/quotes', allow: OFFICE, okStatus: 200 },
  {
    method: 'get',
    path: '/api/quotes/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/quotes/${ctx.quoteId}`,
  },
  { method: 'post', path: '/api/quotes', allow: SELLERS, okStatus: 201, body: (ctx) => quoteBody(ctx) },
  {
    method: 'put',
    path: '/api/quotes/:id',
    allow: SELLERS,
    okStatus: 200,
    url: (ctx) => `/api/quotes/${ctx.quoteId}`,
    body: (ctx) => ({ ...quoteBody(ctx), version: ctx.quoteVersion }),
    after: (ctx, body) => {
      ctx.quoteVersion = body.version ?? ctx.quoteVersion;
    },
  },
  {
    method: 'post',
    path: '/api/quotes/:id/reports',
    allow: SELLERS,
    okStatus: 201,
    url: (ctx) => `/api/quotes/${ctx.quoteId}/reports`,
    body: (ctx) => ({ reportIds: [ctx.reportId] }),
    after: (ctx) => {
      ctx.quoteVersion += 1;
    },
  },
  {
    method: 'post',
    path: '/api/quotes/:id/send',
    allow: SELLERS,
    okStatus: 201,
    url: (ctx, role) => `/api/quotes/${ctx.sendQuoteIds[role] ?? ctx.quoteId}/send`,
  },
  {
    method: 'post',
    path: '/api/quotes/:id/decision',
    allow: SELLERS,
    okStatus: 201,
    url: (ctx, role) => `/api/quotes/${ctx.sentQuoteIds[role] ?? ctx.quoteId}/decision`,
    body: () => ({ status: 'declined' }),
  },
  { method: 'get', path: '/api/outbox', allow: ['admin'], okStatus: 200 },
  {
    method: 'get',
    path: '/api/outbox/:id',
    allow: ['admin'],
    okStatus: 200,
    url: (ctx) => `/api/outbox/${ctx.outboxId}`,
  },
  {
    method: 'get',
    path: '/api/outbox/:id/attachments/:aid',
    allow: ['admin'],
    okStatus: 200,
    url: (ctx) => `/api/outbox/${ctx.outboxId}/attachments/${ctx.attachmentId}`,
  },
  { method: 'get', path: '/api/customers', allow: OFFICE, okStatus: 200 },
  {
    method: 'get',
    path: '/api/customers/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/customers/${ctx.customerId}`,
  },
  {
    method: 'post',
    path: '/api/customers',
    allow: OFFICE,
    okStatus: 201,
    body: (ctx) => ({ name: `Matrix customer ${(ctx.counter += 1)}` }),
  },
  {
    method: 'put',
    path: '/api/customers/:id',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/customers/${ctx.customerId}`,
    body: (ctx) => ({ name: 'Matrix customer', notes: 'edited by the matrix', version: ctx.customerVersion }),
    after: (ctx, body) => {
      ctx.customerVersion = body.version ?? ctx.customerVersion;
    },
  },
  {
    method: 'get',
    path: '/api/customers/:id/records',
    allow: OFFICE,
    okStatus: 200,
    url: (ctx) => `/api/customers/${ctx.customerId}/records`,
  },
  ...(['archive', 'restore'] as const).map((action): RouteRule => ({
    method: 'post',
    path: `/api/customers/:id/${action}`,
    allow: OFFICE,
    okStatus: 201,
    url: (ctx, role) => `/api/customers/${ctx.archiveCustomers[role]?.id ?? ctx.customerId}/${action}`,
    body: (ctx, role) => ({ version: ctx.archiveCustomers[role]?.version ?? 1 }),
    after: (ctx, body) => {
      const saved = body as { id?: number; version?: number };
      for (const own of Object.values(ctx.archiveCustomers))
        if (own && own.id === saved.id) own.version = saved.version ?? own.version;
    },
  })),
  // Last: signing out ends the session every row above used.
  { method: 'post', path: '/api/auth/sign-out', allow: ALL, okStatus: 204 },
];

let app: NestExpressApplication;
const cookies = {} as Record<Role, string>;
const ctx: MatrixContext = {
  targetUserId: 0,
  targetUserVersion: 1,
  materialId: 0,
  materialVersion: 0,
  customerId: 0,
  designId: 0,
  designVersion: 1,
  customerVersion: 1,
  maskRevision: 'A',
  maskId: 0,
  maskVersion: 1,
  doneCalcId: 0,
  fitCalcId: 0,
  cancelCalcIds: {},
  deleteCalcIds: {},
  draftRowVersion: 1,
  stage: { submit: {}, approve: {}, return: {}, release: {}, retire: {} },
  releasedDesignId: 0,
  chamberId: 0,
  chamberVersion: 1,
  calibrationSettingsVersion: 1,
  processVersion: 0,
  shopVersion: 0,
  runId: 0,
  ownRunIds: {},
  spectrumId: 0,
  reportId: 0,
  quoteId: 0,
  quoteVersion: 1,
  sendQuoteIds: {},
  archiveCustomers: {},
  retireMaterials: {},
  sentQuoteIds: {},
  outboxId: 0,
  attachmentId: 0,
  materialIdsByName: {},
  design: {} as ReturnType<typeof twoLayerDesign>,
  passwords: {} as Record<Role, string>,
  counter: 0,
};

beforeAll(async () => {
  app = await createTestApp();
  const admin = demoSignIn('admin');
  const adminCookie = await sessionCookie(app, admin.email, admin.password);
  // One fresh user per role, so the matrix may change their passwords without touching the demo users.
  for (const role of ROLES) {
    const email = `matrix-${role}@larkspur.example`;
    const password = `matrix-${role}-password`;
    const res = await request(app.getHttpServer())
      .post('/api/users')
      .set('Cookie', adminCookie)
      .send({ email, displayName: `Matrix ${role}`, role, password });
    expect(res.status).toBe(201);
    ctx.passwords[role] = password;
    cookies[role] = await sessionCookie(app, email, password);
  }
  const target = await request(app.getHttpServer()).post('/api/users').set('Cookie', adminCookie).send({
    email: 'matrix-target@larkspur.example',
    displayName: 'Matrix Target',
    role: 'operator',
    password: 'long-enough-password',
  });
  ctx.targetUserId = target.body.id;
  ctx.targetUserVersion = target.body.version;
  const material = await request(app.getHttpServer())
    .post('/api/materials')
    .set('Cookie', adminCookie)
    .send(materialBody('Matrix material'));
  expect(material.status).toBe(201);
  ctx.materialId = material.body.id;
  ctx.materialVersion = material.body.version;
  for (const role of DESIGNERS) {
    const own = await request(app.getHttpServer())
      .post('/api/materials')
      .set('Cookie', adminCookie)
      .send(materialBody(`Matrix retire material ${role}`));
    expect(own.status).toBe(201);
    ctx.retireMaterials[role] = { id: own.body.id, version: own.body.version };
  }
  const customer = await request(app.getHttpServer())
    .post('/api/customers')
    .set('Cookie', adminCookie)
    .send({ name: 'Matrix customer' });
  expect(customer.status).toBe(201);
  ctx.customerId = customer.body.id;
  for (const role of OFFICE) {
    const own = await request(app.getHttpServer())
      .post('/api/customers')
      .set('Cookie', adminCookie)
      .send({ name: `Matrix archive customer ${role}` });
    expect(own.status).toBe(201);
    ctx.archiveCustomers[role] = { id: own.body.id, version: own.body.version };
  }
  const mask = await request(app.getHttpServer())
    .post('/api/spec-masks')
    .set('Cookie', adminCookie)
    .send(maskBody(ctx));
  expect(mask.status).toBe(201);
  ctx.maskId = mask.body.id;
  ctx.materialIdsByName = await materialIds(app, adminCookie);
  ctx.design = twoLayerDesign(ctx.materialIdsByName, ctx.customerId, 'Matrix design');
  const chamber = await request(app.getHttpServer())
    .post('/api/chambers')
    .set('Cookie', adminCookie)
    .send(chamberBody(ctx));
  expect(chamber.status).toBe(201);
  ctx.chamberId = chamber.body.id;
  ctx.calibrationSettingsVersion = (
    await request(app.getHttpServer()).get('/api/calibration/settings').set('Cookie', adminCookie)
  ).body.version;
  ctx.processVersion = 0;
  // A logo for the matrix to read; the DELETE row removes it again.
  const logo = await request(app.getHttpServer())
    .put('/api/shop-settings/logo')
    .set('Cookie', adminCookie)
    .send({ contentType: 'image/png', dataBase64: solidPng(30, 10).toString('base64'), version: 0 });
  expect(logo.status, JSON.stringify(logo.body)).toBe(200);
  ctx.shopVersion = logo.body.version;
  const createDesign = async () => {
    const res = await request(app.getHttpServer())
      .post('/api/designs')
      .set('Cookie', adminCookie)
      .send(ctx.design);
    expect(res.status).toBe(201);
    return res.body.id as number;
  };
  ctx.designId = await createDesign();
  // Designs authored and submitted by the demo admin, reviewed by the demo engineer: the matrix users
  // are neither, so the four-eyes rule lets them act.
  const reviewer = await sessionCookie(app, demoSignIn('engineer').email, demoSignIn('engineer').password);
  const step = async (id: number, action: string, cookie: string, body: object = {}) => {
    const res = await request(app.getHttpServer())
      .post(`/api/designs/${id}/versions/1/${action}`)
      .set('Cookie', cookie)
      .send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  };
  const paths: Record<keyof MatrixContext['stage'], [string, string][]> = {
    submit: [],
    approve: [['submit', adminCookie]],
    return: [['submit', adminCookie]],
    release: [
      ['submit', adminCookie],
      ['approve', reviewer],
    ],
    retire: [
      ['submit', adminCookie],
      ['approve', reviewer],
      ['release', reviewer],
    ],
  };
  for (const [action, steps] of Object.entries(paths) as [
    keyof MatrixContext['stage'],
    [string, string][],
  ][]) {
    for (const role of DESIGNERS) {
      const id = await createDesign();
      for (const [move, cookie] of steps)
        await step(id, move, cookie, move === 'submit' ? { rowVersion: 1 } : {});
      ctx.stage[action][role] = id;
    }
  }
  ctx.releasedDesignId = await createDesign();
  for (const [move, cookie] of paths.retire)
    await step(ctx.releasedDesignId, move, cookie, move === 'submit' ? { rowVersion: 1 } : {});
  const run = await request(app.getHttpServer()).post('/api/runs').set('Cookie', adminCookie).send({
    designId: ctx.releasedDesignId,
    versionNumber: 1,
    chamberId: ctx.chamberId,
    lotNumber: 'M-0',
    runDate: '2026-12-01',
  });
  expect(run.status, JSON.stringify(run.body)).toBe(201);
  ctx.runId = run.body.id;
  // Inserted directly: the matrix users choose their own passwords only in the matrix itself.
  for (const role of FLOOR) {
    const [own] = (await app.get(DataSource).query(
      `INSERT INTO chamber_runs (design_id, version_number, chamber_id, lot_number, run_date, operator_id)
       VALUES ($1, 1, $2, $3, '2026-12-01', (SELECT id FROM users WHERE email = $4)) RETURNING id`,
      [ctx.releasedDesignId, ctx.chamberId, `M-${role}`, `matrix-${role}@larkspur.example`],
    )) as { id: number }[];
    ctx.ownRunIds[role] = own!.id;
  }
  const spectrum = await request(app.getHttpServer())
    .post(`/api/runs/${ctx.runId}/spectra`)
    .set('Cookie', adminCookie)
    .send({
      filename: 'm.csv',
      csv: 'wavelength_nm,R_percent\n420,0.3\n680,0.4\n',
      angleDeg: 8,
      sample: 'witness',
    });
  expect(spectrum.status).toBe(201);
  ctx.spectrumId = spectrum.body.id;
  // A report, draft quotes to edit and send, and sent quotes to decide on; one sent with the report
  // attached, so the outbox has a message with an attachment.
  const api = () => request(app.getHttpServer());
  const report = await api()
    .post('/api/reports')
    .set('Cookie', adminCookie)
    .send({ designId: ctx.releasedDesignId, versionNumber: 1, specMaskId: ctx.maskId });
  expect(report.status, JSON.stringify(report.body)).toBe(201);
  ctx.reportId = report.body.id;
  const newQuote = async () => {
    const q = await api().post('/api/quotes').set('Cookie', adminCookie).send(quoteBody(ctx));
    expect(q.status, JSON.stringify(q.body)).toBe(201);
    return q.body as { id: number; version: number };
  };
  const draftQuote = await newQuote();
  ctx.quoteId = draftQuote.id;
  ctx.quoteVersion = draftQuote.version;
  for (const role of SELLERS) {
    ctx.sendQuoteIds[role] = (await newQuote()).id;
    const sent = (await newQuote()).id;
    await api()
      .post(`/api/quotes/${sent}/reports`)
      .set('Cookie', adminCookie)
      .send({ reportIds: [ctx.reportId] });
    expect((await api().post(`/api/quotes/${sent}/send`).set('Cookie', adminCookie)).status).toBe(201);
    ctx.sentQuoteIds[role] = sent;
  }
  const outbox = await api().get('/api/outbox').set('Cookie', adminCookie);
  ctx.outboxId = outbox.body[0].id;
  ctx.attachmentId = outbox.body[0].attachments[0].id;
  // Calculations inserted directly: one completed (1 wavelength, 1 angle), one queued per canceller.
  const db = app.get(DataSource);
  const adminId = (await request(app.getHttpServer()).get('/api/auth/me').set('Cookie', adminCookie)).body
    .user.id;
  const request1 = {
    fromNm: 500,
    toNm: 600,
    wavelengthCount: 1,
    angleFromDeg: 0,
    angleToDeg: 0,
    angleCount: 1,
  };
  const input = JSON.stringify({
    stack: { substrate: { n: 1.52 }, layers: [] },
    back: 'none',
    request: request1,
  });
  const summary = JSON.stringify({
    wavelengthsNm: [500],
    anglesDeg: [0],
    polarisations: ['s', 'p', 'avg'],
    colour: null,
    field: null,
    warnings: [],
  });
  const values = Buffer.from(new Float64Array(9).fill(0.5).buffer);
  const [done] = await db.query(
    `INSERT INTO calculations (kind, input_hash, input, status, summary, values, created_by, progress)
     VALUES ('analysis', $1, $2, 'completed', $3, $4, $5, 1) RETURNING id`,
    ['d'.repeat(64), input, summary, values, adminId],
  );
  ctx.doneCalcId = done.id;
  const [fitCalc] = await db.query(
    `INSERT INTO calculations (kind, input_hash, input, status, summary, design_id, version_number, created_by, progress)
     VALUES ('fit', $1, '{"kind": "fit"}', 'completed', $2, $3, 1, $4, 1) RETURNING id`,
    ['e'.repeat(64), JSON.stringify({ thicknessesNm: [101, 69] }), ctx.designId, adminId],
  );
  ctx.fitCalcId = fitCalc.id;
  for (const [i, role] of DESIGNERS.entries()) {
    const [queued] = await db.query(
      `INSERT INTO calculations (kind, input_hash, input, status, created_by) VALUES ('analysis', $1, $2, 'queued', $3) RETURNING id`,
      [String(i).repeat(64), input, adminId],
    );
    ctx.cancelCalcIds[role] = queued.id;
  }
  for (const [i, role] of DESIGNERS.entries()) {
    const [own] = await db.query(
      `INSERT INTO calculations (kind, input_hash, input, status, created_by)
       VALUES ('analysis', $1, $2, 'cancelled', (SELECT id FROM users WHERE email = $3)) RETURNING id`,
      [String(i + 5).repeat(64), input, `matrix-${role}@larkspur.example`],
    );
    ctx.deleteCalcIds[role] = own.id;
  }
});

afterAll(async () => {
  await app.close();
});

function call(rule: RouteRule, cookie?: string, role: Role | 'anonymous' = 'anonymous') {
  const url = rule.url ? rule.url(ctx, role) : rule.path;
  let req = request(app.getHttpServer())[rule.method](url);
  if (cookie) req = req.set('Cookie', cookie);
  // An unread stream would hold the server's writer back once the socket buffers fill.
  if (rule.download && role !== 'anonymous' && rule.allow !== 'public' && rule.allow.includes(role))
    req = binary(req);
  return rule.body ? req.send(rule.body(ctx, role)) : req;
}

describe('role × route matrix', () => {
  for (const rule of RULES) {
    describe(`${rule.method.toUpperCase()} ${rule.path}`, () => {
      it(rule.allow === 'public' ? `anonymous gets ${rule.okStatus}` : 'anonymous gets 401', async () => {
        const res = await call(rule);
        expect(res.status).toBe(rule.allow === 'public' ? rule.okStatus : 401);
      });
      for (const role of ROLES) {
        const allowed = rule.allow === 'public' || rule.allow.includes(role);
        it(`${role} gets ${allowed ? rule.okStatus : 403}`, async () => {
          const res = await call(rule, cookies[role], role);
          expect(res.status, JSON.stringify(res.body)).toBe(allowed ? rule.okStatus : 403);
          if (allowed) rule.after?.(ctx, res.body);
          if (!allowed) expect(res.body.message).toMatch(/needs the role/);
        });
      }
    });
  }

  it('documents every route in the OpenAPI description at /api/docs-json', async () => {
    const res = await request(app.getHttpServer()).get('/api/docs-json');
    expect(res.status).toBe(200);
    const documented = Object.entries(res.body.paths as Record<string, Record<string, unknown>>).flatMap(
      ([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p.replace(/\{(\w+)\}/g, ':$1')}`),
    );
    expect(documented.sort()).toEqual(RULES.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort());
    const page = await request(app.getHttpServer()).get('/api/docs');
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/swagger-ui/);
  });

  it('covers every route the API registers', () => {
    const registered = registeredRoutes(app).sort();
    const covered = RULES.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(registered).toEqual(covered);
  });
});

/** Method and path of every route on the underlying Express router. */
function registeredRoutes(nest: NestExpressApplication): string[] {
  const express = nest.getHttpAdapter().getInstance() as {
    router: { stack: { route?: { path: string; methods: Record<string, boolean> } }[] };
  };
  const out: string[] = [];
  for (const layer of express.router.stack) {
    if (!layer.route) continue;
    for (const [method, on] of Object.entries(layer.route.methods)) {
      // The OpenAPI pages are public documentation, not API routes.
      if (layer.route.path.startsWith('/api/docs')) continue;
      if (on && method !== '_all') out.push(`${method.toUpperCase()} ${layer.route.path}`);
    }
  }
  return out;
}
