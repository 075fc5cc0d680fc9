/*
 * Run sheets: what an operator sets in the chamber for a released recipe — layers in deposition
 * order with physical and monitor thicknesses, QWOT at the monitor wavelength, rate, time, and the
 * optical monitor's expected transmittance while each layer grows, with its turning points.
 */
import type { RunSheetCalibration } from './calibration.js';
import { elementAt, required } from './checked.js';
import {
  createSpectrumOutput,
  createSpectrumPlan,
  computeSpectrum,
  setLayerThicknesses,
} from './optics/batch.js';
import { indexAt, type MaterialModel } from './optics/dispersion.js';
import { OpticsInputError } from './optics/errors.js';
import type { OpticalStack } from './optics/stack.js';
import type { ProcessSetting } from './chambers.js';

/**
 * Tooling factor convention: TF = thickness deposited on the part ÷ thickness on the monitor, so
 * the monitor thickness to set is the part thickness ÷ TF (TF > 1 when the part sits closer to
 * the source than the monitor). Rates are setpoints read at the monitor.
 */
export const TOOLING_CONVENTION =
  'Tooling factor = thickness on the part ÷ thickness on the monitor; monitor thickness = part thickness ÷ tooling factor. Rates are set at the monitor.';

/** The usual cautions of coating work, printed on every run sheet. */
export const SAFETY_CAUTIONS: readonly string[] = [
  'Electron-beam sources run at several kilovolts: never open the source area or bypass interlocks while high voltage is on; follow lock-out procedures.',
  'Electron-beam evaporation produces X-rays: keep shielding and viewports as fitted; do not look into the source through unshielded ports.',
  'Sources, fixtures, substrate holders and the chamber wall can be hot after a run: let them cool and use heat-resistant gloves.',
  'Vent the chamber only through the normal venting sequence; never open a chamber under vacuum, and handle viewports and bell jars with care.',
  'Coating materials and their dust can be hazardous (fluorides such as MgF2, oxides, metal powders): wear the protective equipment the safety data sheet asks for, clean with wet methods or a suitable vacuum, never by blowing.',
  'These notes do not replace the shop’s own safety procedures, training, the equipment maker’s instructions and local regulations: follow those first.',
];

export interface RunSheetLayerInput {
  /** Material name as the library calls it (tooling and rates are keyed by it). */
  material: string;
  model: MaterialModel;
  /** Physical thickness on the part, nm. */
  thicknessNm: number;
}

export interface ChamberSettings {
  monitorWavelengthNm: number;
  /** Per material name: tooling factor (> 0) and deposition rate at the monitor (nm/s, > 0). */
  materials: Record<string, { toolingFactor: number; rateNmPerS: number }>;
}

export interface RunSheetInput {
  /** Design layers as the design lists them: incident side first. */
  layers: RunSheetLayerInput[];
  /** The monitor chip's material (witness glass); monitored in transmission through the chip. */
  monitorChip: MaterialModel;
  chamber: ChamberSettings;
  /** Samples of the monitor curve per layer. */
  samplesPerLayer?: number;
}

export interface RunSheetLayer {
  /** 1 = first deposited (next to the substrate). */
  step: number;
  /** Position in the design, 1 = outermost (incident side). */
  designLayer: number;
  material: string;
  partThicknessNm: number;
  toolingFactor: number;
  monitorThicknessNm: number;
  /** Quarter-wave optical thicknesses at the monitor wavelength of the monitor thickness: 4·n·d/λ. */
  qwotAtMonitor: number;
  rateNmPerS: number;
  timeS: number;
  /** Expected monitor transmittance (fraction) against the monitor thickness grown in this layer. */
  monitor: { thicknessNm: number[]; T: number[] };
  /** Monitor thicknesses within the layer where the signal turns (extrema), nm. */
  turningPointsNm: number[];
}

export interface RunSheet {
  monitorWavelengthNm: number;
  convention: string;
  layers: RunSheetLayer[];
  totals: { partThicknessNm: number; monitorThicknessNm: number; timeS: number };
  cautions: readonly string[];
}

/** Which surfaces of each part get the coating. */
export const RUN_SHEET_SIDES = ['front', 'both'] as const;
export type RunSheetSides = (typeof RUN_SHEET_SIDES)[number];

/** Limits of what the operator types for a run, written once for the API and the page. */
export const RUN_SHEET_JOB_LIMITS = {
  partMaxLength: 80,
  quantityMax: 100_000,
  /** Same bound as a design's substrate thickness, mm. */
  substrateThicknessMaxMm: 1000,
} as const;

/** One layer of the run sheet with the chamber's process setting for its material (null: none kept). */
export interface RunSheetViewLayer extends RunSheetLayer {
  process: ProcessSetting | null;
}

/** A released recipe's run sheet on one chamber, as the API computes it. */
export interface RunSheetView extends Omit<RunSheet, 'layers'> {
  layers: RunSheetViewLayer[];
  recipe: { designId: number; number: number; name: string; customer: string };
  chamber: { id: number; name: string };
  /** Which calibration the tooling factors come from (the chamber version and, per material, the accepted calibration). */
  calibration: RunSheetCalibration;
  /** The shop for the header; its logo, when `hasLogo`, is at /api/shop-settings/logo. */
  shop: { name: string; hasLogo: boolean };
  /** The substrate from the design; its thickness as entered for this run (the design's by default). */
  substrate: { material: string; thicknessMm: number; designThicknessMm: number };
  /** What this run coats: the part (as the shop names it), how many, which sides. */
  job: { part: string; quantity: number | null; sides: RunSheetSides };
}

/** The sides a design coats: both when its back surface carries the same coating. */
export function sidesOfDesign(backSurface: string): RunSheetSides {
  return backSurface === 'same-coating' ? 'both' : 'front';
}

/** How a run sheet words the sides to coat. */
export const SIDES_LABELS: Record<RunSheetSides, string> = {
  front: 'Front surface only',
  both: 'Both surfaces (same coating on each; run the layers once per side)',
};

/** Builds the run sheet; errors name the layer or material whose settings are missing or wrong. */
export function buildRunSheet(input: RunSheetInput): RunSheet {
  const { chamber } = input;
  const lambda = chamber.monitorWavelengthNm;
  if (!(lambda > 0 && Number.isFinite(lambda))) {
    throw new OpticsInputError('chamber.monitorWavelengthNm', 'must be a wavelength in nm, > 0');
  }
  if (input.layers.length === 0) throw new OpticsInputError('layers', 'a run sheet needs at least one layer');
  const samples = input.samplesPerLayer ?? 200;
  // Deposition order: from the substrate outwards, the reverse of the design's listing.
  const order = input.layers.map((layer, i) => ({ layer, designLayer: i + 1 })).reverse();
  const settings = order.map(({ layer, designLayer }) => {
    const s = chamber.materials[layer.material];
    const at = `layers[${designLayer - 1}]`;
    if (!s)
      throw new OpticsInputError(at, `the chamber has no tooling factor and rate for ${layer.material}`);
    if (!(s.toolingFactor > 0 && Number.isFinite(s.toolingFactor))) {
      throw new OpticsInputError(at, `tooling factor for ${layer.material} must be > 0`);
    }
    if (!(s.rateNmPerS > 0 && Number.isFinite(s.rateNmPerS))) {
      throw new OpticsInputError(at, `rate for ${layer.material} must be > 0 nm/s`);
    }
    if (!(layer.thicknessNm > 0)) throw new OpticsInputError(`${at}.thicknessNm`, 'must be > 0');
    return s;
  });

  const out: RunSheetLayer[] = [];
  for (let step = 0; step < order.length; step++) {
    const { layer, designLayer } = elementAt(order, step, 'the deposition order');
    const { toolingFactor, rateNmPerS } = elementAt(settings, step, 'the process settings');
    const monitorThicknessNm = layer.thicknessNm / toolingFactor;
    const n = indexAt(layer.model, lambda, `layers[${designLayer - 1}]`).n;
    const monitor = monitorCurve(input, order, step, monitorThicknessNm, lambda, samples);
    out.push({
      step: step + 1,
      designLayer,
      material: layer.material,
      partThicknessNm: layer.thicknessNm,
      toolingFactor,
      monitorThicknessNm,
      qwotAtMonitor: (4 * n * monitorThicknessNm) / lambda,
      rateNmPerS,
      timeS: monitorThicknessNm / rateNmPerS,
      monitor,
      turningPointsNm: turningPoints(monitor.thicknessNm, monitor.T),
    });
  }
  const sum = (f: (l: RunSheetLayer) => number) => out.reduce((a, l) => a + f(l), 0);
  return {
    monitorWavelengthNm: lambda,
    convention: TOOLING_CONVENTION,
    layers: out,
    totals: {
      partThicknessNm: sum((l) => l.partThicknessNm),
      monitorThicknessNm: sum((l) => l.monitorThicknessNm),
      timeS: sum((l) => l.timeS),
    },
    cautions: SAFETY_CAUTIONS,
  };
}

/**
 * Transmittance through the monitor chip (incoherent, both surfaces, in vacuum n = 1) at the monitor
 * wavelength while layer `step` grows from 0 to its monitor thickness, on top of the layers
 * deposited before it at their monitor thicknesses.
 */
function monitorCurve(
  input: RunSheetInput,
  order: { layer: RunSheetLayerInput }[],
  step: number,
  monitorThicknessNm: number,
  lambda: number,
  samples: number,
): { thicknessNm: number[]; T: number[] } {
  // Incident side first: the growing layer outermost, then the earlier ones down to the chip.
  const below = order.slice(0, step).reverse();
  const layers = [elementAt(order, step, 'the deposition order'), ...below].map((o, i) => ({
    material: o.layer.model,
    thicknessNm:
      i === 0
        ? 0
        : o.layer.thicknessNm /
          required(input.chamber.materials[o.layer.material], `the settings for ${o.layer.material}`)
            .toolingFactor,
  }));
  const vacuum: MaterialModel = { model: 'constant', n: 1, k: 0 };
  const stack: OpticalStack = {
    incident: vacuum,
    layers,
    substrate: input.monitorChip,
    substrateThicknessMm: 1,
    backLayers: [],
    exit: vacuum,
  };
  const plan = createSpectrumPlan(
    stack,
    { wavelengthsNm: [lambda], anglesDeg: [0], polarisations: ['s'] },
    { back: 'incoherent' },
  );
  const result = createSpectrumOutput(plan);
  const thicknesses = layers.map((l) => l.thicknessNm);
  const thicknessNm: number[] = [];
  const T: number[] = [];
  for (let i = 0; i <= samples; i++) {
    const d = (monitorThicknessNm * i) / samples;
    thicknesses[0] = d;
    setLayerThicknesses(plan, thicknesses);
    computeSpectrum(result, plan);
    thicknessNm.push(d);
    T.push(elementAt(result.T, 0, 'the monitor transmittance'));
  }
  return { thicknessNm, T };
}

/** Interior extrema of a sampled curve, refined by a parabola through the three samples around each. */
export function turningPoints(x: readonly number[], y: readonly number[]): number[] {
  const out: number[] = [];
  const at = (values: readonly number[], i: number) => elementAt(values, i, 'the monitor curve');
  for (let i = 1; i < y.length - 1; i++) {
    const [y0, y1, y2] = [at(y, i - 1), at(y, i), at(y, i + 1)];
    const a = y1 - y0;
    const b = y2 - y1;
    if (a === 0 && b === 0) continue;
    if ((a > 0 && b <= 0) || (a < 0 && b >= 0)) {
      const h = at(x, i + 1) - at(x, i);
      const denom = y0 - 2 * y1 + y2;
      const shift = denom === 0 ? 0 : (0.5 * (y0 - y2)) / denom;
      out.push(at(x, i) + shift * h);
    }
  }
  return out;
}
