import { describe, expect, it } from 'vitest';
import {
  plotCsv,
  roundAxis,
  SERIES_COLOURS,
  SERIES_DASHES,
  styleSeries,
  withAxisDefaults,
} from '../plot-style';

describe('plot style', () => {
  it('uses the Okabe–Ito colour-universal-design palette without its yellow', () => {
    // M. Okabe and K. Ito, "Color Universal Design (CUD)", 2008; as tabulated by B. Wong,
    // "Points of view: Color blindness", Nature Methods 8, 441 (2011).
    expect(SERIES_COLOURS.slice(0, 6)).toEqual([
      '#0072B2',
      '#D55E00',
      '#009E73',
      '#CC79A7',
      '#E69F00',
      '#56B4E9',
    ]);
    expect(SERIES_COLOURS).not.toContain('#F0E442');
  });

  it('gives line series colour i and dash i in turn, keeping what a trace sets itself', () => {
    const styled = styleSeries([
      { type: 'scatter', mode: 'lines', name: '0°', x: [1], y: [1] },
      { type: 'scatter', mode: 'lines', name: 'limit', line: { color: '#333333' } },
      { type: 'scatter', mode: 'lines', name: '20°', x: [1], y: [2] },
      { type: 'heatmap', z: [[1]] },
      { type: 'scatter', mode: 'lines+markers', name: '40°', line: { dash: 'dot' } },
    ]) as { line?: { color?: string; dash?: string } }[];
    expect(styled.map((t) => t.line)).toEqual([
      { color: SERIES_COLOURS[0], dash: 'solid' },
      { color: '#333333' },
      { color: SERIES_COLOURS[1], dash: SERIES_DASHES[1] },
      undefined,
      { color: SERIES_COLOURS[2], dash: 'dot' },
    ]);
  });

  it('writes axes without SI prefixes, keeping what a layout sets', () => {
    const layout = withAxisDefaults({ yaxis: { title: { text: 'k' } }, yaxis2: { exponentformat: 'e' } });
    expect(layout.xaxis).toMatchObject({ exponentformat: 'power', automargin: true });
    expect(layout.yaxis).toMatchObject({ exponentformat: 'power', title: { text: 'k' } });
    expect(layout.yaxis2).toMatchObject({ exponentformat: 'e' });
  });

  it('puts round ticks over the data and keeps an all-zero axis off ±0.5', () => {
    expect(roundAxis([0.12, 0.87], { fromZero: true })).toMatchObject({
      range: [0, 1],
      dtick: 0.2,
      tick0: 0,
      tickformat: '.1f',
    });
    expect(roundAxis([-3.4, 7.9])).toMatchObject({ range: [-5, 10], dtick: 5, tickformat: '.0f' });
    expect(roundAxis([0, 0, 0], { fromZero: true })).toMatchObject({ range: [0, 1] });
  });

  it('exports named series with the axis titles as headers and percent at 4 decimals', () => {
    const csv = plotCsv(
      [
        { type: 'scatter', mode: 'lines', name: 'R 0°', x: [400, 410], y: [0.123456789, 0.5] },
        { type: 'scatter', mode: 'lines', x: [400, 410], y: [9, 9] },
        { type: 'scatter', mode: 'lines', name: 'a*, 8°', x: [400], y: [-1.23456789], yaxis: 'y2' },
      ],
      {
        xaxis: { title: { text: 'Wavelength (nm)' } },
        yaxis: { title: { text: 'R (%)' } },
        yaxis2: { title: { text: 'a*' } },
      },
    );
    expect(csv).toBe(
      [
        'series,Wavelength (nm),R (%),a*',
        'R 0°,400,0.1235,',
        'R 0°,410,0.5000,',
        '"a*, 8°",400,,-1.23457',
        '',
      ].join('\n'),
    );
    const heat = plotCsv(
      [{ type: 'heatmap', x: [400, 500], y: [0], z: [[1.5, 2]], colorbar: { title: { text: 'R (%)' } } }],
      {
        xaxis: { title: { text: 'Wavelength (nm)' } },
        yaxis: { title: { text: 'Angle of incidence (°)' } },
      },
    );
    expect(heat).toBe('Wavelength (nm),Angle of incidence (°),R (%)\n400,0,1.5000\n500,0,2.0000\n');
  });

  it("writes category x values (a control chart's runs) as text", () => {
    const csv = plotCsv(
      [
        {
          type: 'scatter',
          mode: 'markers',
          name: 'Correction',
          x: ['L-7 (2026-11-02)', 'L-8, rerun'],
          y: [1.25, -0.5],
        },
      ],
      {
        xaxis: { title: { text: 'Diagnosed run' }, type: 'category' },
        yaxis: { title: { text: 'Correction, %' } },
      },
    );
    expect(csv).toBe(
      [
        'series,Diagnosed run,"Correction, %"',
        'Correction,L-7 (2026-11-02),1.2500',
        'Correction,"L-8, rerun",-0.5000',
        '',
      ].join('\n'),
    );
  });
});
