/*
 * How every Quietglass plot tells its series apart and writes its numbers: a colour-blind-safe
 * categorical palette paired with dash styles, axes without SI prefixes, and the CSV export of
 * what a plot shows.
 */
import { elementAt, niceTicks } from '@quietglass/shared';
import type { Data, Layout, LayoutAxis } from 'plotly.js-dist-min';

/**
 * Series colours: the colour-universal-design palette of M. Okabe and K. Ito ("Color Universal
 * Design", 2008; also B. Wong, Nature Methods 8, 441 (2011)) — blue, vermillion, bluish green,
 * reddish purple, orange, sky blue, black — without its yellow, which is too pale on white.
 */
export const SERIES_COLOURS = [
  '#0072B2',
  '#D55E00',
  '#009E73',
  '#CC79A7',
  '#E69F00',
  '#56B4E9',
  '#000000',
] as const;

/** Dash styles paired with the colours, so series differ in grey print and for every reader. */
export const SERIES_DASHES = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot'] as const;

type Trace = Data & { type?: string; mode?: string; line?: { color?: string; dash?: string } };

const isLineTrace = (t: Trace) =>
  (t.type === undefined || t.type === 'scatter' || t.type === 'scattergl') &&
  (t.mode === undefined || t.mode.includes('lines'));

/**
 * Gives each line series without a colour of its own the next palette colour and dash style
 * (series i: colour i, dash i), so neighbouring series never differ by hue alone. Traces that set
 * their colour or dash keep them.
 */
export function styleSeries(data: readonly Data[]): Data[] {
  let next = 0;
  return data.map((d) => {
    const t = d as Trace;
    if (!isLineTrace(t) || t.line?.color !== undefined) return d;
    const i = next++;
    return {
      ...t,
      line: {
        ...t.line,
        color: SERIES_COLOURS[i % SERIES_COLOURS.length],
        dash: t.line?.dash ?? SERIES_DASHES[i % SERIES_DASHES.length],
      },
    } as Data;
  });
}

/** Axis defaults: plain numbers or powers of ten (never "100μ"), room for long tick labels. */
export const AXIS_DEFAULTS: Partial<LayoutAxis> = { exponentformat: 'power', automargin: true };

/** Every axis of a layout (xaxis, yaxis2, …) with {@link AXIS_DEFAULTS} under its own settings. */
export function withAxisDefaults(layout: Partial<Layout>): Partial<Layout> {
  const out: Record<string, unknown> = { ...layout };
  for (const key of ['xaxis', 'yaxis', ...Object.keys(layout).filter((k) => /^[xy]axis\d+$/.test(k))]) {
    out[key] = { ...AXIS_DEFAULTS, ...((layout as Record<string, unknown>)[key] ?? {}) };
  }
  return out as Partial<Layout>;
}

/**
 * An axis with round ticks (1, 2 or 5 × 10ⁿ) over the values, fixed so the plotting library does
 * not pick its own; an axis of values that are all zero runs from 0 to 1 (no ticks at ±0.5).
 */
export function roundAxis(
  values: readonly number[],
  options: { fromZero?: boolean } = {},
): Partial<LayoutAxis> {
  const finite = values.filter(Number.isFinite);
  let lo = finite.length ? Math.min(...finite) : 0;
  let hi = finite.length ? Math.max(...finite) : 1;
  if (options.fromZero) lo = Math.min(0, lo);
  if (hi === lo) hi = lo === 0 ? 1 : hi + Math.abs(hi) * 0.1;
  const t = niceTicks(lo, hi, 6);
  return {
    range: [t.min, t.max],
    tickmode: 'linear',
    tick0: t.min,
    dtick: t.step,
    tickformat: `.${t.decimals}f`,
  };
}

const axisTitle = (layout: Partial<Layout> | undefined, key: string, fallback: string): string => {
  const axis = (layout as Record<string, { title?: { text?: string } | string } | undefined> | undefined)?.[
    key
  ];
  const title = axis?.title;
  const text = typeof title === 'string' ? title : title?.text;
  return text && text.trim() !== '' ? text.replace(/<[^>]+>/g, '') : fallback;
};

/**
 * `R (%)` → percent: four decimals; anything else: up to 6 significant digits. A category value
 * (text, e.g. a run's lot number on a control chart) is written as it is.
 */
function formatter(title: string): (v: number | string) => string {
  const number = /%|percent/i.test(title)
    ? (v: number) => v.toFixed(4)
    : (v: number) => String(Number(v.toPrecision(6)));
  return (v) => (typeof v === 'number' ? number(v) : csvCell(String(v)));
}

const csvCell = (text: string) => (/[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text);

/**
 * The named line series of a plot as CSV: one row per point, `series,<x title>,<y title>`, the
 * axis titles (with their units) as headers, percent values with 4 decimals. A series on a second
 * y axis gets that axis's title in its own column. Unnamed traces (fills, limit shading) are left
 * out; heat maps are written as x, y, z rows.
 */
export function plotCsv(data: readonly Data[], layout?: Partial<Layout>): string {
  const xTitle = axisTitle(layout, 'xaxis', 'x');
  const heat = data.find((d) => (d as Trace).type === 'heatmap') as
    | {
        x?: ArrayLike<number>;
        y?: ArrayLike<number>;
        z?: ArrayLike<ArrayLike<number>>;
        colorbar?: { title?: { text?: string } };
      }
    | undefined;
  if (heat?.x && heat.y && heat.z) {
    const yTitle = axisTitle(layout, 'yaxis', 'y');
    const zTitle = heat.colorbar?.title?.text ?? 'z';
    const fx = formatter(xTitle);
    const fy = formatter(yTitle);
    const fz = formatter(zTitle);
    const rows = [[xTitle, yTitle, zTitle].map(csvCell).join(',')];
    for (let j = 0; j < heat.y.length; j++) {
      const y = fy(elementAt(heat.y, j, 'the heat map y values'));
      const z = elementAt(heat.z, j, 'the heat map rows');
      for (let i = 0; i < heat.x.length; i++)
        rows.push(
          `${fx(elementAt(heat.x, i, 'the heat map x values'))},${y},${fz(elementAt(z, i, 'a heat map row'))}`,
        );
    }
    return `${rows.join('\n')}\n`;
  }
  const series = data.filter((d) => {
    const t = d as Trace & { name?: string; x?: unknown; y?: unknown };
    return isLineTraceOrMarkers(t) && typeof t.name === 'string' && t.name !== '' && t.x && t.y;
  }) as (Trace & { name: string; x: ArrayLike<number | string>; y: ArrayLike<number>; yaxis?: string })[];
  const yKeys = [
    ...new Set(series.map((s) => (s.yaxis && s.yaxis !== 'y' ? `yaxis${s.yaxis.slice(1)}` : 'yaxis'))),
  ];
  const yTitles = yKeys.map((k) => axisTitle(layout, k, k === 'yaxis' ? 'y' : k.replace('axis', '')));
  const fx = formatter(xTitle);
  const rows = [['series', xTitle, ...yTitles].map(csvCell).join(',')];
  for (const s of series) {
    const key = s.yaxis && s.yaxis !== 'y' ? `yaxis${s.yaxis.slice(1)}` : 'yaxis';
    const col = yKeys.indexOf(key);
    const fy = formatter(elementAt(yTitles, col, 'the y axis titles'));
    for (let i = 0; i < s.x.length; i++) {
      const y = s.y[i];
      if (typeof y !== 'number' || !Number.isFinite(y)) continue;
      const cells = yTitles.map((_t, c) => (c === col ? fy(y) : ''));
      rows.push([csvCell(s.name), fx(elementAt(s.x, i, 'the x values')), ...cells].join(','));
    }
  }
  return `${rows.join('\n')}\n`;
}

function isLineTraceOrMarkers(t: Trace): boolean {
  return t.type === undefined || t.type === 'scatter' || t.type === 'scattergl';
}
