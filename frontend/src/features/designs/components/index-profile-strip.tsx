import { indexAt } from '@quietglass/shared';
import { useMemo } from 'react';
import { Plot, PLOT_COLOURS, type PlotData } from '../../../components/plot';
import { parsedThickness, type LayerRow, type LibraryMaterial } from '../layers';

export interface IndexStep {
  /** Depth from the incident side where the layer starts and ends, nm. */
  fromNm: number;
  toNm: number;
  n: number;
  name: string;
}

/**
 * The refractive index n at the reference wavelength against depth from the incident side, one step
 * per layer; rows that are not valid yet (no material, bad thickness) are left out.
 */
export function indexSteps(
  rows: readonly LayerRow[],
  materialsById: ReadonlyMap<number, LibraryMaterial>,
  referenceNm: number | null,
): IndexStep[] {
  if (referenceNm === null) return [];
  const steps: IndexStep[] = [];
  let depth = 0;
  for (const row of rows) {
    const thickness = parsedThickness(row);
    const material = materialsById.get(row.materialId ?? -1);
    if (thickness === null || !material) continue;
    try {
      const { n } = indexAt(material.model, referenceNm);
      steps.push({ fromNm: depth, toNm: depth + thickness, n, name: material.name });
    } catch {
      // A model that cannot be evaluated at λref is shown as a gap.
    }
    depth += thickness;
  }
  return steps;
}

interface IndexProfileStripProps {
  rows: readonly LayerRow[];
  materials: readonly LibraryMaterial[];
  referenceWavelengthNm: number | null;
}

/** A thin plot of n(λref) against depth beside the Layer grid: the stack's index profile at a glance. */
export function IndexProfileStrip({ rows, materials, referenceWavelengthNm }: IndexProfileStripProps) {
  const materialsById = useMemo(() => new Map(materials.map((m) => [m.id, m])), [materials]);
  const steps = useMemo(
    () => indexSteps(rows, materialsById, referenceWavelengthNm),
    [rows, materialsById, referenceWavelengthNm],
  );
  if (steps.length === 0) return null;
  const x = steps.flatMap((s) => [s.fromNm, s.toNm]);
  const y = steps.flatMap((s) => [s.n, s.n]);
  const text = steps.flatMap((s, i) => [`${i + 1} ${s.name}`, `${i + 1} ${s.name}`]);
  const data: PlotData[] = [
    {
      type: 'scatter',
      mode: 'lines',
      name: `n at ${referenceWavelengthNm} nm`,
      x,
      y,
      text,
      hovertemplate: '%{text}<br>depth %{x:.1f} nm<br>n %{y:.4f}<extra></extra>',
      line: { color: PLOT_COLOURS[0], width: 2, shape: 'linear' },
      fill: 'tozeroy',
      fillcolor: 'rgba(31, 107, 112, 0.12)',
    },
  ];
  const ns = steps.map((s) => s.n);
  const low = Math.floor(Math.min(...ns) * 10) / 10 - 0.1;
  const high = Math.ceil(Math.max(...ns) * 10) / 10 + 0.1;
  return (
    <Plot
      title="Index profile"
      data={data}
      height={130}
      layout={{
        margin: { t: 8, b: 36, l: 48, r: 12 },
        showlegend: false,
        xaxis: { title: { text: 'Depth from the incident side (nm)' } },
        yaxis: { title: { text: `n (${referenceWavelengthNm} nm)` }, range: [low, high] },
      }}
    />
  );
}
