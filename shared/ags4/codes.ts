/**
 * How AGS4 abbreviation codes map to Pastload's kinds and types, and the
 * descriptions written into a file's ABBR group. Codes and descriptions
 * marked AGS4 are those of the standard dictionary's ABBR list (edition 4.1).
 */
import type { PointKind, SampleType } from '../investigation/types'

export interface CodeMeaning<T> {
  value: T
  description: string
  /** Source written to ABBR_LIST. */
  list: string
  /** Said to the user when a file's code is read this way but loses a distinction. */
  note?: string
}

const AGS4 = 'AGS4'
const PASTLOAD = 'Pastload'

/** LOCA_TYPE (type of activity) → point kind. */
export const LOCA_TYPES: Readonly<Record<string, CodeMeaning<PointKind>>> = {
  CP: { value: 'borehole', description: 'Cable percussion (shell and auger)', list: AGS4 },
  RC: { value: 'borehole', description: 'Rotary cored', list: AGS4 },
  RO: { value: 'borehole', description: 'Rotary open hole', list: AGS4 },
  RCG: { value: 'borehole', description: 'Rotary drilling in common ground', list: AGS4 },
  SNC: { value: 'borehole', description: 'Sonic core drilling', list: AGS4 },
  W: { value: 'borehole', description: 'Wash boring', list: AGS4 },
  WS: { value: 'borehole', description: 'Window Sampler', list: AGS4 },
  WLS: { value: 'borehole', description: 'Dynamic (windowless) sampler', list: AGS4 },
  DS: { value: 'borehole', description: 'Dynamic Sampler', list: AGS4 },
  HA: { value: 'borehole', description: 'Hand Auger', list: AGS4 },
  AUGH: { value: 'borehole', description: 'Hollow Stem Auger', list: AGS4 },
  AUGS: { value: 'borehole', description: 'Solid Stem Auger', list: AGS4 },
  VC: { value: 'borehole', description: 'Vibrocore', list: AGS4 },
  PM: { value: 'borehole', description: 'Pressuremeter test hole', list: AGS4 },
  RPC: { value: 'borehole', description: 'Russian Peat Corer', list: AGS4 },
  EH: { value: 'borehole', description: 'Exploratory Hole', list: AGS4 },
  SCP: { value: 'cpt', description: 'Static cone penetrometer', list: AGS4 },
  // Not in the AGS4 list, but common in files for a cone test.
  CPT: { value: 'cpt', description: 'Cone penetration test', list: PASTLOAD },
  TP: { value: 'test-pit', description: 'Trial pit/trench', list: AGS4 },
  TT: { value: 'test-pit', description: 'Trial trench', list: AGS4 },
  OP: { value: 'test-pit', description: 'Observation pit/trench', list: AGS4 },
  IP: { value: 'test-pit', description: 'Inspection pit', list: AGS4 },
  INST: { value: 'piezometer', description: 'instrument', list: AGS4 },
}

/** The code written for a kind; a borehole whose method is the description of a drilling code gets that code. */
export function locaTypeFor(kind: PointKind, method: string): string {
  if (kind === 'cpt') return 'SCP'
  if (kind === 'test-pit') return 'TP'
  if (kind === 'piezometer') return 'INST'
  const wanted = method.trim().toLowerCase()
  for (const [code, meaning] of Object.entries(LOCA_TYPES)) {
    if (meaning.value === 'borehole' && meaning.list === AGS4 && (meaning.description.toLowerCase() === wanted || code.toLowerCase() === wanted)) return code
  }
  return 'EH'
}

/** SAMP_TYPE → sample type. Water, gas and environmental samples have no Pastload type. */
export const SAMP_TYPES: Readonly<Record<string, CodeMeaning<SampleType>>> = {
  UT: { value: 'thin-walled-tube', description: 'Thin wall open drive tube sampler', list: AGS4 },
  TW: { value: 'thin-walled-tube', description: 'Thin walled push in sample', list: AGS4 },
  U: { value: 'thin-walled-tube', description: 'Undisturbed sample - open drive', list: AGS4, note: 'SAMP_TYPE U (open-drive sample, often a thick-walled U100) is read as a tube sample; check its quality class' },
  P: { value: 'piston', description: 'Piston sample', list: AGS4 },
  BLK: { value: 'block', description: 'Block sample', list: AGS4 },
  B: { value: 'bulk', description: 'Bulk disturbed sample', list: AGS4 },
  LB: { value: 'bulk', description: 'Large bulk disturbed sample (for earthworks testing)', list: AGS4 },
  D: { value: 'bulk', description: 'Small disturbed sample', list: AGS4, note: 'SAMP_TYPE D (small disturbed sample) is read as a bulk (disturbed) sample' },
  // Not in the AGS4 4.1 list (which has SPTLS, the liner sample), but the usual code for the split-spoon sample.
  SPT: { value: 'spt-split-spoon', description: 'Split-spoon sample from the standard penetration test', list: PASTLOAD },
  SPTLS: { value: 'spt-split-spoon', description: 'Standard penetration test liner sample', list: AGS4 },
  C: { value: 'core', description: 'Core sample', list: AGS4 },
  M: { value: 'core', description: 'Mazier type sample', list: AGS4, note: 'SAMP_TYPE M (Mazier sample) is read as a core sample' },
  L: { value: 'core', description: 'Liner sample (dynamic)', list: AGS4, note: 'SAMP_TYPE L (liner from dynamic sampling) is read as a core sample' },
}

export const SAMPLE_TYPE_CODES: Readonly<Record<SampleType, string>> = {
  'thin-walled-tube': 'UT',
  'piston': 'P',
  'block': 'BLK',
  'bulk': 'B',
  'spt-split-spoon': 'SPT',
  'core': 'C',
}

/** USCS group names (ASTM D2487) for the ABBR descriptions of GEOL_GEO2, where Pastload writes the group symbol. */
export const USCS_NAMES: Readonly<Record<string, string>> = {
  'GW': 'Well-graded gravel', 'GP': 'Poorly graded gravel', 'GM': 'Silty gravel', 'GC': 'Clayey gravel',
  'GW-GM': 'Well-graded gravel with silt', 'GW-GC': 'Well-graded gravel with clay', 'GP-GM': 'Poorly graded gravel with silt', 'GP-GC': 'Poorly graded gravel with clay',
  'SW': 'Well-graded sand', 'SP': 'Poorly graded sand', 'SM': 'Silty sand', 'SC': 'Clayey sand',
  'SW-SM': 'Well-graded sand with silt', 'SW-SC': 'Well-graded sand with clay', 'SP-SM': 'Poorly graded sand with silt', 'SP-SC': 'Poorly graded sand with clay',
  'CL': 'Lean clay', 'ML': 'Silt', 'OL': 'Organic clay or silt (low plasticity)', 'CH': 'Fat clay', 'MH': 'Elastic silt', 'OH': 'Organic clay or silt (high plasticity)', 'PT': 'Peat',
  'CL-ML': 'Silty clay', 'GC-GM': 'Silty, clayey gravel', 'SC-SM': 'Silty, clayey sand',
}

/** MONG_TYPE codes that mark a piezometer; PIEZ is Pastload's own, for a piezometer of unrecorded type. */
export const PIEZOMETER_MONG_TYPES = new Set(['PIEZ', 'SPIE', 'EPIE', 'PPIE', 'HPIE'])
export const STANDING_LEVEL_MONG_TYPE = 'SWL'
export const PIEZOMETER_MONG_TYPE = 'PIEZ'

/** Descriptions of the codes Pastload writes outside the tables above. */
export const OTHER_CODES: Readonly<Record<string, Readonly<Record<string, { description: string, list: string }>>>> = {
  MONG_TYPE: {
    PIEZ: { description: 'Piezometer (type not recorded)', list: PASTLOAD },
    SWL: { description: 'Standing water level observation in the hole', list: PASTLOAD },
  },
  MOND_TYPE: {
    PRES: { description: 'Pressure', list: AGS4 },
    WDEP: { description: 'Depth to water from LOCA_ID datum', list: AGS4 },
  },
  CONG_TYPE: {
    OEDOMETER: { description: 'Oedometer', list: AGS4 },
    CRS: { description: 'Constant rate of strain oedometer (ASTM D4186)', list: PASTLOAD },
  },
  DICT_TYPE: {
    GROUP: { description: 'Flag to indicate definition is a GROUP', list: AGS4 },
    HEADING: { description: 'Flag to indicate definition is a HEADING', list: AGS4 },
  },
  DICT_STAT: {
    KEY: { description: 'Key field', list: AGS4 },
    REQUIRED: { description: 'Required field', list: AGS4 },
    OTHER: { description: 'Other field', list: AGS4 },
  },
}

export const UNIT_DESCRIPTIONS: Readonly<Record<string, string>> = {
  'm': 'metre',
  'mm': 'millimetre',
  '%': 'percentage',
  'kPa': 'kiloPascal',
  'MPa': 'megaPascal',
  'kN/m3': 'kiloNewtons per cubic metre',
  'Mg/m3': 'megagrams per cubic metre',
  'ft': 'foot',
  'psf': 'pounds-force per square foot',
  'tsf': 'short tons-force per square foot',
  'pcf': 'pounds-force per cubic foot',
  'yyyy-mm-dd': 'year month day',
  'yyyy-mm-ddThh:mm:ssZ': 'year month day hours minutes seconds, UTC (ISO 8601)',
}

const TYPE_WORDS: Readonly<Record<string, string>> = {
  DMS: 'Degrees:Minutes:Seconds',
  DT: 'Date time in international format',
  ID: 'Unique Identifier',
  MC: 'British Standard BS1377 : Part 2 reported moisture content',
  PA: 'Text listed in ABBR Group',
  PT: 'Text listed in TYPE Group',
  PU: 'Text listed in UNIT Group',
  RL: 'Record link',
  T: 'Elapsed time',
  U: 'Value with variable format',
  X: 'Text',
  XN: 'Text / numeric',
  YN: 'Y or N or NULL',
}

/** TYPE_DESC for a type code, worded as the standard dictionary's TYPE group. */
export function describeType(type: string): string {
  const decimals = /^(\d+)DP$/.exec(type)
  if (decimals) return `Value; required number of decimal places, ${decimals[1]}`
  const figures = /^(\d+)SF$/.exec(type)
  if (figures) return `Value; required number of significant figures, ${figures[1]}`
  const scientific = /^(\d+)SCI$/.exec(type)
  if (scientific) return `Scientific Notation; required number of decimal places, ${scientific[1]}`
  return TYPE_WORDS[type] ?? type
}
