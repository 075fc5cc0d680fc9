import {
  designStackDescription,
  engineBackSurface,
  type DesignVersionContent,
  type LimitBand,
  type NamedModel,
  type Polarisation,
} from '@quietglass/shared';
import type { PreviewRequest } from './compute-preview';

/** The preview's own settings (what to draw), chosen beside the plot. */
export interface PreviewOptions {
  fromNm: number;
  toNm: number;
  count: number;
  anglesDeg: number[];
  polarisation: Polarisation;
}

export const DEFAULT_PREVIEW_OPTIONS: PreviewOptions = {
  fromNm: 380,
  toNm: 780,
  count: 1000,
  anglesDeg: [0],
  polarisation: 'avg',
};

/**
 * The preview request for a version's content, or an error naming what is missing (a material
 * not in the library, say). The colour is taken at the first plotted angle.
 */
export function previewRequestFor(
  slot: string,
  content: DesignVersionContent,
  materials: ReadonlyMap<number, NamedModel> | Record<string, NamedModel>,
  maskBands: LimitBand[] | null,
  options: PreviewOptions,
): { ok: true; request: PreviewRequest } | { ok: false; error: string } {
  try {
    return {
      ok: true,
      request: {
        slot,
        stack: designStackDescription(content, materials),
        back: engineBackSurface(content.backSurface),
        wavelengths: { fromNm: options.fromNm, toNm: options.toNm, count: options.count },
        anglesDeg: options.anglesDeg,
        polarisation: options.polarisation,
        maskBands,
        colourAngleDeg: options.anglesDeg[0] ?? 0,
      },
    };
  } catch (error) {
    return { ok: false, error: error instanceof Error ? error.message : String(error) };
  }
}
