import type { SiteModelDefinition } from '../../shared/site-model/definition'

/**
 * A site-model definition written straight from the invented demo scenario's ground model
 * (`shared/demo-scenario.md`, the "truth" table): for settlement-run tests that need a whole,
 * complete profile without seeding a project. Trend parameters are the scenario's values, not fits.
 */
export function scenarioDefinition(): SiteModelDefinition {
  const fit = { n: 10, r2: null, rmse: null, aic: null, aicc: null, includedPointIds: [], excludedPointIds: [], logSpace: false }
  return {
    schemaVersion: 2,
    surcharge: 0,
    gammaW: 9.81,
    groundwater: {
      waterTableDepth: 1.6,
      // Hydrostatic to 12 m; under-drained toward the sand, whose piezometric level is 4.5 m below ground.
      piezometers: [{ depth: 12, porePressure: 9.81 * (12 - 1.6) }, { depth: 21.5, porePressure: 9.81 * (21.5 - 4.5) }],
    },
    strata: [
      { code: 'MG', name: 'Made ground', thickness: 1.2, unitWeight: 19, unitWeightSaturated: 20, compressible: false, cptFactor: 0.33 },
      {
        code: 'CRUST', name: 'Desiccated crust', thickness: 2.2, unitWeight: 18, unitWeightSaturated: 18.5, compressible: true, cptFactor: 0.33,
        compressibility: { cc: 0.35, cr: 0.04, e0: 1.1, cv: 3, drainage: 'double', source: 'manual' },
        trend: { ...fit, model: 'linear', parameters: { intercept: 210 + (115 / 2.2) * 1.2, gradient: -115 / 2.2 } },
      },
      {
        code: 'EST', name: 'Estuarine clay', thickness: 11.6, unitWeight: 16, unitWeightSaturated: 16, compressible: true, cptFactor: 0.33,
        compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, calpha: 0.03, drainage: 'double', source: 'manual' },
        trend: { ...fit, model: 'pop', parameters: { pop: 25 } },
      },
      {
        code: 'GLA', name: 'Older glacial clay', thickness: 6.5, unitWeight: 20.5, unitWeightSaturated: 20.5, compressible: true, cptFactor: 0.33,
        compressibility: { cc: 0.22, cr: 0.03, e0: 0.65, cv: 6, drainage: 'double', source: 'manual' },
        trend: { ...fit, model: 'ocr', parameters: { ocr: 2.4 } },
      },
      { code: 'SAND', name: 'Dense sand', thickness: 8.5, unitWeight: 20, unitWeightSaturated: 20, compressible: false, cptFactor: 0.33 },
    ],
    flagsInForce: [],
  }
}
