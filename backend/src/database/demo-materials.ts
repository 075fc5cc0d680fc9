import type { ProvenanceKind } from '@quietglass/shared/materials';
import type { MaterialModel } from '@quietglass/shared/optics/dispersion';
import { MATERIAL_LIBRARY } from '@quietglass/shared/optics/library';
import { readLibraryFile } from '../materials/constants-library.js';

export interface DemoMaterial {
  name: string;
  model: MaterialModel;
  rangeNm: { from: number; to: number };
  provenanceKind: ProvenanceKind;
  source: string;
  processNotes: string;
  /** The published constants file it was read from, kept with it for download. */
  file?: { fileName: string; text: string };
}

/**
 * The demo shop's library names for the published optical-constants files
 * (backend/assets/optical-constants). The short names (SiO2, ZrO2 …) are the films the demo
 * chamber and design use; other samples of the same material carry their kind and author.
 */
const LIBRARY_NAMES: readonly [file: string, name: string][] = [
  ['film/mgf2--rodriguez-de-marcos.yml', 'MgF2'],
  ['film/sio2--gao.yml', 'SiO2'],
  ['film/al2o3--franta.yml', 'Al2O3'],
  ['film/hfo2--al-kuhaili.yml', 'HfO2'],
  ['film/zro2--synowicki.yml', 'ZrO2'],
  ['film/ta2o5--gao.yml', 'Ta2O5'],
  ['film/nb2o5--lemarchand.yml', 'Nb2O5'],
  ['film/tio2--sarkar.yml', 'TiO2'],
  ['film/si3n4--beliaev.yml', 'Si3N4 (PECVD)'],
  ['film/zns--amotchkina.yml', 'ZnS (e-beam)'],
  ['film/sio2--lemarchand.yml', 'SiO2 (sputtered, Lemarchand)'],
  ['film/sio2--rodriguez-de-marcos.yml', 'SiO2 (e-beam 300 °C, Rodríguez-de Marcos)'],
  ['film/ta2o5--rodriguez-de-marcos.yml', 'Ta2O5 (e-beam 300 °C, Rodríguez-de Marcos)'],
  ['film/tio2--siefke.yml', 'TiO2 (ALD, Siefke)'],
  ['film/al2o3--zhukovsky.yml', 'Al2O3 (ALD, Zhukovsky)'],
  ['metal/ag--mcpeak.yml', 'Ag'],
  ['metal/al--mcpeak.yml', 'Al'],
  ['metal/cr--johnson.yml', 'Cr'],
  ['substrate/fused-silica--malitson.yml', 'Fused silica'],
  ['substrate/sapphire-o--malitson-o.yml', 'Sapphire (ordinary ray)'],
  ['substrate/caf2--malitson.yml', 'CaF2'],
  ['substrate/b270--b270.yml', 'B270'],
  ['substrate/si--green-2008.yml', 'Si'],
  ['substrate/ge--burnett.yml', 'Ge'],
  ['substrate/polycarbonate--sultanova.yml', 'Polycarbonate'],
  ['substrate/pmma--sultanova.yml', 'PMMA'],
];

/** A library file as a demo material: its reference (and DOI) as source, its notes as notes. */
function fromLibrary(file: string, name: string): DemoMaterial {
  const { text, parsed, fileName } = readLibraryFile(file);
  return {
    name,
    model: parsed.model,
    rangeNm: parsed.rangeNm,
    provenanceKind: 'published',
    source: parsed.doi ? `${parsed.reference}\nDOI: ${parsed.doi}` : parsed.reference,
    processNotes: [parsed.notes, `Data: ${parsed.form}`].filter((l) => l !== '').join('\n'),
    file: { fileName, text },
  };
}

function libraryModel(name: string): MaterialModel {
  const model = MATERIAL_LIBRARY[name];
  if (model === undefined) throw new Error(`${name} is not in the material library`);
  return model;
}

/** Air, N-BK7 (SCHOTT coefficients) and the published optical-constants files. */
export const DEMO_MATERIALS: readonly DemoMaterial[] = [
  {
    name: 'Air',
    model: libraryModel('air'),
    rangeNm: { from: 150, to: 20_000 },
    provenanceKind: 'typical',
    source: 'Taken as n = 1; air (about 1.0003 at 550 nm) differs by less than coating work resolves',
    processNotes: 'Incident and exit medium',
  },
  {
    name: 'N-BK7',
    // SCHOTT states the Sellmeier coefficients for 0.3–2.5 µm.
    model: { ...MATERIAL_LIBRARY['N-BK7'], validNm: { from: 300, to: 2500 } } as MaterialModel,
    rangeNm: { from: 300, to: 2500 },
    provenanceKind: 'published',
    source: 'SCHOTT optical glass data sheet, N-BK7 Sellmeier coefficients',
    processNotes: 'Substrate glass',
  },
  ...LIBRARY_NAMES.map(([file, name]) => fromLibrary(file, name)),
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
 * MgF2 / ZrO2 / Al2O3 / SiO2, incident side first, on N-BK7, thicknesses found with the optics engine's
 * Fit to mask for the demo library's published films (MgF2 Rodríguez-de Marcos et al., ZrO2
 * Synowicki, Al2O3 Franta et al., SiO2 Gao et al.; worst margin +0.096 percentage points). Mira Castell wrote and submitted version 1; Tomas Reyes approved
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
      ['MgF2', 94.2],
      ['ZrO2', 119.1],
      ['Al2O3', 79.6],
      ['SiO2', 89.3],
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
