/*
 * The instant preview's computation, as a plain module: the preview worker runs it off the main
 * thread, and tests and the benchmark call it directly. It depends on the optics engine alone (no
 * DOM, no React), so it runs in a worker, in jsdom and in Node alike.
 */
import {
  colourWavelengthsNm,
  computeSpectrum,
  createSpectrumOutput,
  createSpectrumPlan,
  evaluateMaskOnSpectrum,
  maskGrid,
  parseStack,
  setLayerThicknesses,
  spectrumColour,
  validateSpecMask,
  type BackSurface,
  type LimitBand,
  type MaskPoint,
  type Polarisation,
  type SpecMask,
  type SpectrumOutput,
  type SpectrumPlan,
  type StackDescription,
} from '@quietglass/shared';

/** What to preview: one stack on an even wavelength grid at some angles, with its mask and colour. */
export interface PreviewRequest {
  /**
   * Which curve set this is (the live grid, a compared version…). The computation is planned once
   * per slot and reused while only layer thicknesses change, which is what typing in the grid does.
   */
  slot: string;
  stack: StackDescription;
  back: BackSurface;
  /** Evenly spaced wavelengths, nm, ends included. */
  wavelengths: { fromNm: number; toNm: number; count: number };
  /** Angles of incidence to draw, degrees. */
  anglesDeg: number[];
  polarisation: Polarisation;
  /** The design's spec mask, or null when it has none. */
  maskBands: LimitBand[] | null;
  /** Angle for the reflected colour and Rv (unpolarised, D65), or null for none. */
  colourAngleDeg: number | null;
}

export interface PreviewCurve {
  angleDeg: number;
  /** Fractions 0–1 at `wavelengthsNm`, in the request's polarisation. */
  R: Float64Array;
  T: Float64Array;
}

export interface PreviewMaskBand {
  band: number;
  label?: string;
  pass: boolean;
  /** Percentage points; ≥ 0 inside the bound. */
  worstMargin: number;
  worstAt: MaskPoint;
}

export interface PreviewMaskResult {
  pass: boolean;
  worstMargin: number;
  worstBand: number;
  worstAt: MaskPoint;
  merit: number;
  bands: PreviewMaskBand[];
}

export interface PreviewColour {
  angleDeg: number;
  /** CIE 1931 XYZ, Y = 100 for a perfect reflector (D65). */
  X: number;
  Y: number;
  Z: number;
  L: number;
  a: number;
  b: number;
  x: number;
  y: number;
  /** Luminous reflectance, fraction. */
  Rv: number;
}

export interface PreviewResult {
  wavelengthsNm: Float64Array;
  curves: PreviewCurve[];
  mask: PreviewMaskResult | null;
  /** Why the mask could not be evaluated (the spectrum itself is still shown). */
  maskError: string | null;
  colour: PreviewColour | null;
  colourError: string | null;
  /** Approximations the engine flagged, e.g. table values held at their ends. */
  warnings: string[];
}

/** Message from the page to the preview worker. */
export interface PreviewWorkerRequest {
  id: number;
  request: PreviewRequest;
}

/** Answer of the preview worker to the request with the same id. */
export type PreviewWorkerResponse =
  { id: number; ok: true; result: PreviewResult } | { id: number; ok: false; error: string };

/** Most wavelengths one preview may ask for. */
export const MAX_PREVIEW_WAVELENGTHS = 5000;

interface Computed {
  plan: SpectrumPlan;
  out: SpectrumOutput;
}

interface SlotState {
  key: string;
  display: Computed;
  mask: (Computed & { mask: SpecMask }) | { error: string } | null;
  colour: Computed | { error: string } | null;
}

function message(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** Everything about a request except the front layers' thicknesses: equal keys share a plan. */
function structureKey(request: PreviewRequest): string {
  const { stack } = request;
  return JSON.stringify({
    ...request,
    slot: undefined,
    stack: { ...stack, layers: stack.layers.map((layer) => ({ ...layer, thickness_nm: 0 })) },
  });
}

function evenlySpacedNm({ fromNm, toNm, count }: PreviewRequest['wavelengths']): Float64Array {
  if (!(Number.isInteger(count) && count >= 2 && count <= MAX_PREVIEW_WAVELENGTHS)) {
    throw new Error(`wavelength count must be a whole number from 2 to ${MAX_PREVIEW_WAVELENGTHS}`);
  }
  if (!(Number.isFinite(fromNm) && fromNm > 0 && Number.isFinite(toNm) && toNm > fromNm)) {
    throw new Error(
      `the wavelength range must run from a value > 0 up to a larger one (${fromNm}–${toNm} nm)`,
    );
  }
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) out[i] = fromNm + ((toNm - fromNm) * i) / (count - 1);
  return out;
}

function planned(plan: SpectrumPlan): Computed {
  return { plan, out: createSpectrumOutput(plan) };
}

function buildSlot(request: PreviewRequest, key: string): SlotState {
  const stack = parseStack(request.stack);
  const options = { back: request.back };
  const display = planned(
    createSpectrumPlan(
      stack,
      {
        wavelengthsNm: evenlySpacedNm(request.wavelengths),
        anglesDeg: request.anglesDeg,
        polarisations: [request.polarisation],
      },
      options,
    ),
  );
  let mask: SlotState['mask'] = null;
  if (request.maskBands && request.maskBands.length > 0) {
    try {
      const checked = validateSpecMask({ bands: request.maskBands });
      mask = { ...planned(createSpectrumPlan(stack, maskGrid(checked), options)), mask: checked };
    } catch (error) {
      mask = { error: message(error) };
    }
  }
  let colour: SlotState['colour'] = null;
  if (request.colourAngleDeg !== null) {
    try {
      colour = planned(
        createSpectrumPlan(
          stack,
          {
            wavelengthsNm: colourWavelengthsNm(),
            anglesDeg: [request.colourAngleDeg],
            polarisations: ['avg'],
          },
          options,
        ),
      );
    } catch (error) {
      colour = { error: message(error) };
    }
  }
  return { key, display, mask, colour };
}

function thicknessesOf(request: PreviewRequest): number[] {
  return request.stack.layers.map((layer, i) => {
    const d = layer.thickness_nm;
    if (typeof d !== 'number') throw new Error(`layers[${i}]: the preview needs thicknesses in nm`);
    return d;
  });
}

/**
 * A preview calculator holding one plan per slot. `compute` returns the curves, the mask verdict
 * (worst margin and where it is) and the reflected colour; it throws a clear error for a stack the
 * engine cannot compute (the message names the field, e.g. `layers[2].thickness_nm`).
 */
export function createPreviewCalculator(): { compute(request: PreviewRequest): PreviewResult } {
  const slots = new Map<string, SlotState>();

  return {
    compute(request: PreviewRequest): PreviewResult {
      const key = structureKey(request);
      let slot = slots.get(request.slot);
      if (slot && slot.key === key) {
        const thicknesses = thicknessesOf(request);
        setLayerThicknesses(slot.display.plan, thicknesses);
        if (slot.mask && 'plan' in slot.mask) setLayerThicknesses(slot.mask.plan, thicknesses);
        if (slot.colour && 'plan' in slot.colour) setLayerThicknesses(slot.colour.plan, thicknesses);
      } else {
        slots.delete(request.slot);
        slot = buildSlot(request, key);
        slots.set(request.slot, slot);
      }

      const { plan, out } = slot.display;
      computeSpectrum(out, plan);
      const nW = plan.wavelengthsNm.length;
      const curves = request.anglesDeg.map((angleDeg, ia) => ({
        angleDeg,
        R: out.R.slice(ia * nW, (ia + 1) * nW),
        T: out.T.slice(ia * nW, (ia + 1) * nW),
      }));

      let mask: PreviewMaskResult | null = null;
      let maskError: string | null = null;
      if (slot.mask && 'plan' in slot.mask) {
        computeSpectrum(slot.mask.out, slot.mask.plan);
        const result = evaluateMaskOnSpectrum(slot.mask.mask, slot.mask.plan, slot.mask.out);
        mask = {
          pass: result.pass,
          worstMargin: result.worstMargin,
          worstBand: result.worstBand,
          worstAt: result.worstAt,
          merit: result.merit,
          bands: result.bands.map(({ band, label, pass, worstMargin, worstAt }) =>
            label === undefined
              ? { band, pass, worstMargin, worstAt }
              : { band, label, pass, worstMargin, worstAt },
          ),
        };
      } else if (slot.mask) {
        maskError = slot.mask.error;
      }

      let colour: PreviewColour | null = null;
      let colourError: string | null = null;
      if (slot.colour && 'plan' in slot.colour && request.colourAngleDeg !== null) {
        computeSpectrum(slot.colour.out, slot.colour.plan);
        const c = spectrumColour(slot.colour.out.R, 'D65');
        colour = {
          angleDeg: request.colourAngleDeg,
          X: c.X,
          Y: c.Y,
          Z: c.Z,
          L: c.L,
          a: c.a,
          b: c.b,
          x: c.x,
          y: c.y,
          Rv: c.Rv,
        };
      } else if (slot.colour && 'error' in slot.colour) {
        colourError = slot.colour.error;
      }

      return {
        wavelengthsNm: plan.wavelengthsNm.slice(),
        curves,
        mask,
        maskError,
        colour,
        colourError,
        warnings: [...plan.warnings],
      };
    },
  };
}

/** The buffers of a result, handed over to the page instead of copied. */
export function previewTransferables(result: PreviewResult): ArrayBuffer[] {
  const buffers: ArrayBuffer[] = [result.wavelengthsNm.buffer as ArrayBuffer];
  for (const curve of result.curves)
    buffers.push(curve.R.buffer as ArrayBuffer, curve.T.buffer as ArrayBuffer);
  return buffers;
}

/** Answers one worker message; never throws (errors become `ok: false` with the message). */
export function answerPreviewRequest(
  calculator: ReturnType<typeof createPreviewCalculator>,
  message_: PreviewWorkerRequest,
): PreviewWorkerResponse {
  try {
    return { id: message_.id, ok: true, result: calculator.compute(message_.request) };
  } catch (error) {
    return { id: message_.id, ok: false, error: message(error) };
  }
}
