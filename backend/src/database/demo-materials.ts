import type { MaterialModel } from '@quietglass/shared/optics/dispersion';
import { MATERIAL_LIBRARY } from '@quietglass/shared/optics/library';

export interface DemoMaterial {
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  typical: boolean;
  source: string;
  processNotes: string;
}

const TYPICAL_SOURCE =
  'Typical index near 550 nm (common practice, from memory); demo data only — measure your own process';

/**
 * A Cauchy model n = A + B/λ² (λ in µm) through the typical index at 550 nm, with a modest,
 * typical dispersion B. Demo values, not measurements.
 */
function typicalCauchy(n550: number, B: number): MaterialModel {
  return { model: 'cauchy', A: n550 - B / 0.55 ** 2, B, C: 0, k: 0 };
}

/** Substrates from published Sellmeier coefficients; coating materials as typical demo values. */
export const DEMO_MATERIALS: readonly DemoMaterial[] = [
  {
    name: 'Air',
    model: MATERIAL_LIBRARY.air,
    rangeNm: { from: 150, to: 20_000 },
    typical: false,
    source: 'Taken as n = 1; air (about 1.0003 at 550 nm) differs by less than coating work resolves',
    processNotes: 'Incident and exit medium',
  },
  {
    name: 'N-BK7',
    model: MATERIAL_LIBRARY['N-BK7'],
    rangeNm: { from: 300, to: 2500 },
    typical: false,
    source: 'SCHOTT optical glass data sheet, N-BK7 Sellmeier coefficients',
    processNotes: 'Substrate glass',
  },
  {
    name: 'Fused silica',
    model: MATERIAL_LIBRARY['fused-silica'],
    rangeNm: { from: 210, to: 3700 },
    typical: false,
    source: 'I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965)',
    processNotes: 'Substrate glass',
  },
  ...(
    [
      ['MgF2', 1.38, 0.003, 200],
      ['SiO2', 1.46, 0.0035, 200],
      ['Al2O3', 1.63, 0.008, 250],
      ['HfO2', 1.95, 0.015, 250],
      ['ZrO2', 2.05, 0.02, 300],
      ['Ta2O5', 2.1, 0.022, 320],
      ['Nb2O5', 2.3, 0.03, 380],
      ['TiO2', 2.35, 0.035, 400],
    ] as const
  ).map(([name, n550, B, fromNm]) => ({
    name,
    model: typicalCauchy(n550, B),
    rangeNm: { from: fromNm, to: 1100 },
    typical: true,
    source: TYPICAL_SOURCE,
    processNotes: 'Evaporated film; no chamber data yet',
  })),
];

/** Invented customers of the invented demo shop. */
export const DEMO_CUSTOMERS: readonly { name: string; contactEmail: string; notes: string }[] = [
  {
    name: 'Halden Vision Systems',
    contactEmail: 'optics@halden-vision.example',
    notes: 'Machine-vision lens assemblies',
  },
  {
    name: 'Orrin Medical Imaging',
    contactEmail: 'purchasing@orrin-medical.example',
    notes: 'Endoscope windows',
  },
  { name: 'Brightwater Instruments', contactEmail: 'lab@brightwater.example', notes: 'Spectrometer optics' },
];

/**
 * Demo spec masks (invented customers' invented drawings). The first is the usual visible broadband
 * AR requirement: R ≤ 0.5 % over 420–680 nm at 0–30°, unpolarised (common practice, no source).
 */
export const DEMO_SPEC_MASKS: readonly {
  customer: string;
  name: string;
  revision: string;
  bands: Record<string, unknown>[];
  notes: string;
}[] = [
  {
    customer: 'Halden Vision Systems',
    name: 'HVS-2210 lens AR',
    revision: 'A',
    bands: [
      {
        from_nm: 420,
        to_nm: 680,
        angles_deg: [0, 15, 30],
        polarisation: 'avg',
        quantity: 'R',
        max_percent: 0.5,
        step_nm: 2,
      },
    ],
    notes: 'Both surfaces; average polarisation',
  },
  {
    customer: 'Orrin Medical Imaging',
    name: 'OMI window 532',
    revision: 'B',
    bands: [
      {
        from_nm: 527,
        to_nm: 537,
        angles_deg: [0],
        polarisation: 'avg',
        quantity: 'R',
        max_percent: 0.25,
        step_nm: 1,
      },
      {
        from_nm: 450,
        to_nm: 650,
        angles_deg: [0],
        polarisation: 'avg',
        quantity: 'R',
        max_percent: 1.5,
        step_nm: 5,
      },
    ],
    notes: 'Laser line plus visible viewing band',
  },
];

/**
 * The demo shop's chamber (invented): tooling factors and rates are demo values, not measurements;
 * a shop enters its own from calibration runs.
 */
export const DEMO_CHAMBERS: readonly {
  name: string;
  monitorWavelengthsNm: number[];
  monitorChip: string;
  materials: [string, number, number][];
  notes: string;
}[] = [
  {
    name: 'Box coater B2',
    monitorWavelengthsNm: [550, 632.8],
    monitorChip: 'Fused silica',
    materials: [
      ['MgF2', 1.08, 0.8],
      ['SiO2', 1.04, 0.8],
      ['Al2O3', 1.0, 0.5],
      ['HfO2', 0.96, 0.3],
      ['ZrO2', 0.97, 0.4],
      ['Ta2O5', 0.98, 0.4],
      ['Nb2O5', 0.97, 0.35],
      ['TiO2', 0.95, 0.3],
    ],
    notes:
      'Electron-beam sources, quartz-crystal rate control, optical monitor through a fused-silica chip (demo data)',
  },
];

/**
 * The demo shop's designs (invented scenario). "HVS-2210 four-layer AR" answers Halden's lens mask:
 * MgF2 / ZrO2 / Al2O3 / SiO2, incident side first, on N-BK7, thicknesses found with the optics engine
 * for the demo's typical materials. Mira Castell wrote and submitted version 1; Tomas Reyes approved
 * and released it, so operators have a recipe to build and sales a version to quote.
 */
export const DEMO_DESIGNS: readonly {
  name: string;
  customer: string;
  mask: { name: string; revision: string };
  author: string;
  reviewer: string;
  incident: string;
  substrate: string;
  substrateThicknessMm: number;
  referenceWavelengthNm: number;
  layers: [material: string, thicknessNm: number][];
  notes: string;
}[] = [
  {
    name: 'HVS-2210 four-layer AR',
    customer: 'Halden Vision Systems',
    mask: { name: 'HVS-2210 lens AR', revision: 'A' },
    author: 'mira.castell@larkspur.example',
    reviewer: 'tomas.reyes@larkspur.example',
    incident: 'Air',
    substrate: 'N-BK7',
    substrateThicknessMm: 2,
    referenceWavelengthNm: 550,
    layers: [
      ['MgF2', 96.8],
      ['ZrO2', 127.6],
      ['Al2O3', 84.2],
      ['SiO2', 76.2],
    ],
    notes: 'Front surface of the lens; demo design',
  },
];

/**
 * The demo chamber's process settings per material (invented scenario values, not a recipe to
 * follow): substrate temperature °C, base pressure mbar, O₂ flow sccm (null: none), and the
 * ion-assist source's voltage V, current A and gas flow sccm (null: no ion assist).
 */
export const DEMO_PROCESS_SETTINGS: Record<
  string,
  readonly [
    name: string,
    temperatureC: number,
    basePressureMbar: number,
    o2FlowSccm: number | null,
    ion: [voltageV: number, currentA: number, gasSccm: number] | null,
  ][]
> = {
  'Box coater B2': [
    ['MgF2', 280, 2e-5, null, null],
    ['SiO2', 200, 2e-5, 8, [110, 2.0, 10]],
    ['Al2O3', 200, 2e-5, 12, [120, 2.5, 10]],
    ['HfO2', 200, 2e-5, 15, [130, 3.0, 12]],
    ['ZrO2', 200, 2e-5, 15, [130, 3.0, 12]],
    ['Ta2O5', 200, 2e-5, 18, [140, 3.0, 12]],
    ['Nb2O5', 200, 2e-5, 18, [140, 3.0, 12]],
    ['TiO2', 200, 2e-5, 20, [140, 3.5, 14]],
  ],
};
