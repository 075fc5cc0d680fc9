import { describe, expect, it } from 'vitest';
import { parseConstantsFile } from './constants-file.js';
import { indexAt } from './dispersion.js';
import { OpticsInputError } from './errors.js';

// Excerpts of published optical-constants files (public domain); each test names the reference.
const FUSED_SILICA = `# header comment
REFERENCES: |
    1) I. H. Malitson.
    Interspecimen comparison of the refractive index of fused silica.
    <a href="https://doi.org/10.1364/JOSA.55.001205"><i>J. Opt. Soc. Am.</i> <b>55</b>, 1205-1208 (1965)</a><br>
    2) C. Z. Tan.
    Determination of refractive index of silica glass for infrared wavelengths by IR spectroscopy.
COMMENTS: |
    Fused silica, 20 °C
DATA:
  - type: formula 1
    wavelength_range: 0.21 6.7
    coefficients: 0 0.6961663 0.0684043 0.4079426 0.1162414 0.8974794 9.896161
CONDITIONS:
    temperature: 293
`;

const CAF2 = `REFERENCES: |
    I. H. Malitson.
    A redetermination of some optical properties of calcium fluoride.
    <a href="https://doi.org/10.1364/AO.2.001103"><i>Appl. Opt.</i> <b>2</b>, 1103-1107 (1963)</a>
COMMENTS: |
    24 °C
DATA:
  - type: formula 1
    wavelength_range: 0.23 9.7
    coefficients: 0 0.5675888 0.050263605 0.4710914 0.1003909 3.8484723 34.649040
`;

const SAPPHIRE_O = `REFERENCES: |
    1) I. H. Malitson and M. J. Dodge.
    Refractive index and birefringence of synthetic sapphire.
COMMENTS: |
    Synthetic sapphire, Ordinary ray (o), 20 °C
DATA:
  - type: formula 1
    wavelength_range: 0.20 5.0
    coefficients: 0 1.4313493 0.0726631 0.65054713 0.1193242 5.3414021 18.028251
`;

const HFO2 = `REFERENCES: |
    M. F. Al-Kuhaili.
    Optical properties of hafnium oxide thin films and their application in energy-efficient windows.
    <a href="https://doi.org/10.1016/j.optmat.2004.04.014"><i>Opt. Mat.</i> <b>27</b>, 383-387 (2004)</a>
COMMENTS: |
    Thin films of hafnium oxide deposited by electron beam evaporation.
DATA:
  - type: formula 5
    wavelength_range: 0.2 2.0
    coefficients: 1.875 6.28e-3 -2 5.80e-4 -4
`;

const SI_EXCERPT = `REFERENCES: |
    M. A. Green.
    Self-consistent optical parameters of intrinsic silicon at 300K including temperature coefficients.
    <a href="https://doi.org/10.1016/j.solmat.2008.06.009"><i>Sol. Energ. Mat. Sol. Cells</i> <b>92</b>, 1305–1310 (2008)</a>
COMMENTS: |
    300 K (27 °C).
DATA:
  - type: tabulated nk
    data: |
        4.9000e-01 4.3500e+00 4.9131e-02
        5.0000e-01 4.2940e+00 4.4165e-02
        5.1000e-01 4.2410e+00 3.9367e-02
`;

const ZNS_EXCERPT = `REFERENCES: |
    T. Amotchkina, M. Trubetskov, D. Hahner, V. Pervak.
    Characterization of e-beam evaporated Ge, YbF<sub>3</sub>, ZnS, and LaF<sub>3</sub> thin films for laser-oriented coatings.
    <a href="https://doi.org/10.1364/AO.59.000A40"><i>Appl. Opt.</i> <b>59</b>, A40-A47 (2020)</a>
COMMENTS: |
    1.008 µm ZnS film deposited on 3 mm thick Ge substrate.
DATA:
  - type: formula 2
    wavelength_range: 0.4 14
    coefficients: 0.010356 3.619092 0.02345364 0.508130 0.099946 2.219955 1148.729
  - type: tabulated k
    data: |
        0.40 1.92E-03
        0.50 9.80E-04
        0.60 4.99E-04
`;

describe('published optical-constants files', () => {
  it('fused silica, Malitson, J. Opt. Soc. Am. 55, 1205 (1965): n(587.6 nm) = 1.45846 within 0.21–6.7 µm', () => {
    const file = parseConstantsFile(FUSED_SILICA);
    expect(file.model).toMatchObject({ model: 'sellmeier', validNm: { from: 210, to: 6700 } });
    expect(file.rangeNm).toEqual({ from: 210, to: 6700 });
    expect(indexAt(file.model, 587.6).n).toBeCloseTo(1.45846, 5);
    expect(file.doi).toBe('10.1364/JOSA.55.001205');
    expect(file.reference).toBe(
      '1) I. H. Malitson. Interspecimen comparison of the refractive index of fused silica. J. Opt. Soc. Am. 55, 1205-1208 (1965)\n' +
        '2) C. Z. Tan. Determination of refractive index of silica glass for infrared wavelengths by IR spectroscopy.',
    );
    expect(file.notes).toBe('Fused silica, 20 °C\nConditions: temperature: 293');
    expect(() => indexAt(file.model, 8000)).toThrow(
      /outside the sellmeier model's valid range \(210–6700 nm\)/,
    );
  });

  it('CaF2, Malitson, Appl. Opt. 2, 1103 (1963): n(587.6 nm) = 1.43385', () => {
    const file = parseConstantsFile(CAF2);
    expect(indexAt(file.model, 587.6).n).toBeCloseTo(1.43385, 5);
    expect(file.rangeNm).toEqual({ from: 230, to: 9700 });
  });

  it('sapphire ordinary ray, Malitson & Dodge, J. Opt. Soc. Am. 62, 1405 (1972): n(589.3 nm) = 1.76808', () => {
    const file = parseConstantsFile(SAPPHIRE_O);
    // formula 1 gives resonance wavelengths: C is stored squared, 0.0726631² µm².
    expect(file.model).toMatchObject({
      model: 'sellmeier',
      C: [0.0726631 ** 2, 0.1193242 ** 2, 18.028251 ** 2],
    });
    expect(indexAt(file.model, 589.3).n).toBeCloseTo(1.76808, 5);
    expect(file.doi).toBeNull();
  });

  it('HfO2, Al-Kuhaili, Opt. Mat. 27, 383 (2004): formula 5 read as Cauchy, n(550 nm) = 1.875 + 6.28e-3/0.55² + 5.8e-4/0.55⁴', () => {
    const file = parseConstantsFile(HFO2);
    expect(file.model).toMatchObject({
      model: 'cauchy',
      A: 1.875,
      B: 6.28e-3,
      C: 5.8e-4,
      validNm: { from: 200, to: 2000 },
    });
    expect(indexAt(file.model, 550).n).toBeCloseTo(1.875 + 6.28e-3 / 0.3025 + 5.8e-4 / 0.3025 ** 2, 12);
    expect(file.form).toBe('Cauchy formula (formula 5), 0.2–2 µm');
  });

  it('Si, Green, Sol. Energ. Mat. Sol. Cells 92, 1305 (2008): tabulated rows in nm', () => {
    const file = parseConstantsFile(SI_EXCERPT);
    expect(file.model).toEqual({
      model: 'table',
      wavelengths: [490, 500, 510],
      n: [4.35, 4.294, 4.241],
      k: [0.049131, 0.044165, 0.039367],
      interpolation: 'linear',
      clamp: false,
    });
    expect(indexAt(file.model, 500)).toEqual({ n: 4.294, k: 0.044165 });
    expect(file.rangeNm).toEqual({ from: 490, to: 510 });
  });

  it('ZnS, Amotchkina et al., Appl. Opt. 59, A40 (2020): formula 2 n with its constant term at the tabulated-k rows', () => {
    const file = parseConstantsFile(ZNS_EXCERPT);
    const n500 = Math.sqrt(
      1 +
        0.010356 +
        (3.619092 * 0.25) / (0.25 - 0.02345364) +
        (0.50813 * 0.25) / (0.25 - 0.099946) +
        (2.219955 * 0.25) / (0.25 - 1148.729),
    );
    expect(file.model.model).toBe('table');
    expect(indexAt(file.model, 500).n).toBeCloseTo(n500, 12);
    expect(indexAt(file.model, 500).k).toBeCloseTo(9.8e-4, 12);
    expect(file.rangeNm).toEqual({ from: 400, to: 600 });
    expect(file.reference).toContain('YbF3, ZnS, and LaF3 thin films');
  });

  it('refuses files it cannot read, naming the part', () => {
    expect(() => parseConstantsFile('')).toThrow(OpticsInputError);
    expect(() => parseConstantsFile(CAF2.replace(/REFERENCES[\s\S]*?COMMENTS/, 'COMMENTS'))).toThrow(
      /REFERENCES: the file names no literature reference/,
    );
    expect(() => parseConstantsFile(CAF2.replace('formula 1', 'formula 9'))).toThrow(
      /"formula 9" is not read/,
    );
    expect(() => parseConstantsFile(SI_EXCERPT.replace('5.0000e-01 4.2940e+00', '5.0000e-01 x'))).toThrow(
      /DATA\[0\]\.data row 2: not a number/,
    );
    expect(() => parseConstantsFile(SI_EXCERPT.replace('5.1000e-01', '4.0000e-01'))).toThrow(
      /does not increase/,
    );
    expect(() => parseConstantsFile(CAF2.replace('coefficients: 0 ', 'coefficients: 0.2 '))).toThrow(
      /constant term/,
    );
    expect(() => parseConstantsFile(CAF2.replace('0.23 9.7', '9.7 0.23'))).toThrow(/wavelength_range/);
  });
});
