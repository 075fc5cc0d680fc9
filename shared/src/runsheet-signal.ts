/*
 * The expected optical-monitor signal of a whole run on one axis, for the run sheet's chart on the
 * page and in the PDF.
 */
import type { RunSheetLayer } from './runsheet.js';
import { elementAt } from './checked.js';

export interface MonitorTrace {
  name: string;
  material: string;
  /** Monitor thickness deposited since the start of the run, nm. */
  x: number[];
  /** Expected monitor transmittance, %. */
  y: number[];
}

export interface MonitorMarks {
  x: number[];
  y: number[];
  /** Hover text: step and thickness within the layer. */
  text: string[];
}

/** Linear interpolation of a sampled curve at `at` (the samples rise in x). */
function valueAt(x: readonly number[], y: readonly number[], at: number): number {
  const [x0, y0] = [x[0], y[0]];
  if (x0 === undefined || y0 === undefined) return Number.NaN;
  if (at <= x0) return y0;
  for (let i = 1; i < x.length; i++) {
    const [xa, xb] = [elementAt(x, i - 1, 'the samples'), elementAt(x, i, 'the samples')];
    if (at <= xb) {
      const [ya, yb] = [elementAt(y, i - 1, 'the values'), elementAt(y, i, 'the values')];
      return ya + ((at - xa) / (xb - xa || 1)) * (yb - ya);
    }
  }
  return elementAt(y, y.length - 1, 'the values');
}

/**
 * Each layer's monitor curve shifted by the monitor thickness deposited before it, with its turning
 * points and the point where the layer stops.
 */
export function monitorPlotData(layers: readonly RunSheetLayer[]): {
  traces: MonitorTrace[];
  turningPoints: MonitorMarks;
  layerEnds: MonitorMarks;
} {
  const traces: MonitorTrace[] = [];
  const turningPoints: MonitorMarks = { x: [], y: [], text: [] };
  const layerEnds: MonitorMarks = { x: [], y: [], text: [] };
  let offset = 0;
  for (const layer of layers) {
    const { thicknessNm, T } = layer.monitor;
    const y = T.map((t) => t * 100);
    traces.push({
      name: `${layer.step} ${layer.material}`,
      material: layer.material,
      x: thicknessNm.map((d) => offset + d),
      y,
    });
    for (const tp of layer.turningPointsNm) {
      turningPoints.x.push(offset + tp);
      turningPoints.y.push(valueAt(thicknessNm, y, tp));
      turningPoints.text.push(`Step ${layer.step}: turning point at ${tp.toFixed(1)} nm into the layer`);
    }
    layerEnds.x.push(offset + layer.monitorThicknessNm);
    layerEnds.y.push(elementAt(y, y.length - 1, 'the monitor curve'));
    layerEnds.text.push(`Step ${layer.step}: stop at ${layer.monitorThicknessNm.toFixed(2)} nm`);
    offset += layer.monitorThicknessNm;
  }
  return { traces, turningPoints, layerEnds };
}
