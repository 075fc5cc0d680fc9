export * from './checked.js';
export * from './roles.js';
export * from './designs.js';
export * from './analysis.js';
export * from './runsheet.js';
export * from './runsheet-signal.js';
export * from './measured.js';
export * from './reports.js';
export * from './quotes.js';
export * from './runs.js';
export * from './chambers.js';
export * from './schemas/common.js';
export * from './schemas/chambers.js';
export * from './schemas/calibration.js';
export * from './schemas/shop.js';
export * from './schemas/users.js';
export * from './schemas/customers.js';
export * from './schemas/quotes.js';
export * from './schemas/reports.js';
export * from './schemas/spec-masks.js';
export * from './schemas/designs.js';
export * from './schemas/runs.js';
export * from './schemas/materials.js';
export * from './schemas/optimise.js';
export * from './schemas/process-settings.js';
export * from './schemas/audit.js';
export * from './schemas/run-sheet.js';
export * from './calibration.js';
export * from './recipes.js';
export * from './outbox.js';
export * from './calculations.js';
export * from './audit.js';
export * from './revisions.js';
export * from './materials.js';
export * from './customers.js';
export * from './stack-file.js';

// Optics engine (browser-safe; Node-only helpers live under @quietglass/shared/node/parallel).
export * from './optics/errors.js';
export * from './optics/dispersion.js';
export * from './optics/library.js';
export * from './optics/constants-file.js';
export * from './optics/thickness.js';
export * from './optics/stack.js';
export * from './optics/matrix.js';
export * from './optics/substrate.js';
export * from './optics/batch.js';
export * from './optics/mask.js';
export * from './optics/colour.js';
export * from './optics/field.js';
export * from './optics/derivatives.js';

// Optimisation: Fit to mask, Grow layers, Yield forecast (browser-safe; the worker-thread splitter
// lives under @quietglass/shared/node/yield-parallel).
export * from './optimise/merit.js';
export * from './optimise/fit.js';
export * from './optimise/needle.js';
export * from './optimise/yield.js';
export * from './optimise/result-forecast.js';

// Plot defaults shared by the client's plots.
export * from './plots/plot-range.js';
export * from './plots/nice-ticks.js';
export * from './shop.js';
