import type { ProjectRole } from '../auth/roles'

/**
 * The invented demo site, Saltmarsh Lane Freight Terminal (TRN-0417). No real
 * place, firm or person. The demo password is valid only in a seeded demo database.
 */
export const DEMO_PASSWORD = 'pastload-demo-2026'

export const DEMO_PROJECT = {
  jobNumber: 'TRN-0417',
  name: 'Saltmarsh Lane Freight Terminal',
  client: 'Harrow Estuary Logistics',
  unitSystem: 'SI' as const,
  description: 'A 6.0 m granular embankment (about 120 kPa) for a 120 m × 80 m container yard on reclaimed estuarine ground: desiccated crust over soft estuarine clay over older glacial clay and a pumped sand aquifer.',
}

export const DEMO_PEOPLE: { email: string, displayName: string, role: ProjectRole, isSiteAdmin: boolean }[] = [
  { email: 'ana.ferreira@harrow-estuary.example', displayName: 'Ana Ferreira', role: 'geologist', isSiteAdmin: false },
  { email: 'tomas.lindqvist@harrow-estuary.example', displayName: 'Tomas Lindqvist', role: 'engineer', isSiteAdmin: false },
  { email: 'priya.natarajan@harrow-estuary.example', displayName: 'Priya Natarajan', role: 'reviewer', isSiteAdmin: false },
  { email: 'sam.okafor@harrow-estuary.example', displayName: 'Sam Okafor', role: 'designer', isSiteAdmin: false },
  { email: 'lee.moreau@harrow-estuary.example', displayName: 'Lee Moreau', role: 'owner', isSiteAdmin: true },
]
