import type { PlotData, PlotLayout } from '../components/plot';

/**
 * Stand-in for components/plot in jsdom (no canvas, no WebGL): a named figure that lists its
 * traces, so tests can read what would be drawn. Use with
 * `vi.mock('…/components/plot', () => import('…/test/plot-mock'))`.
 */
export { SERIES_COLOURS as PLOT_COLOURS } from '../lib/plot-style';
export const HEAT_COLOUR_SCALE: [number, string][] = [
  [0, '#ffffff'],
  [1, '#000000'],
];

/** JSON with typed arrays written as plain arrays. */
function serialise(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    ArrayBuffer.isView(v) ? Array.from(v as unknown as ArrayLike<number>) : v,
  );
}

interface MockPlotProps {
  title: string;
  data: PlotData[];
  layout?: PlotLayout;
  pngFileName?: string;
}

export function Plot({ title, data, layout }: MockPlotProps) {
  return (
    <div role="figure" aria-label={title} data-layout={serialise(layout ?? {})}>
      <ul aria-label={`${title} traces`}>
        {data.map((trace, i) => (
          <li key={i} data-trace={serialise(trace)}>
            {`${trace.type ?? 'scatter'}: ${trace.name ?? ''}`}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The traces a mocked plot was given, parsed back from the figure. */
export function tracesOf(figure: HTMLElement): Record<string, unknown>[] {
  return [...figure.querySelectorAll('li[data-trace]')].map(
    (li) => JSON.parse(li.getAttribute('data-trace') ?? '{}') as Record<string, unknown>,
  );
}

/** The layout a mocked plot was given. */
export function layoutOf(figure: HTMLElement): Record<string, unknown> {
  return JSON.parse(figure.getAttribute('data-layout') ?? '{}') as Record<string, unknown>;
}
