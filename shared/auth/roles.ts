/**
 * Per-project roles and what each may do. The server guard
 * (`server/utils/guards.ts`) is the authority; the UI uses the same table to
 * hide what a role cannot do. docs/roles.md is the human-readable copy.
 */
export const PROJECT_ROLES = ['owner', 'engineer', 'geologist', 'reviewer', 'designer', 'viewer'] as const
export type ProjectRole = (typeof PROJECT_ROLES)[number]

export const ROLE_LABELS: Record<ProjectRole, string> = {
  owner: 'Owner',
  engineer: 'Geotechnical engineer',
  geologist: 'Field geologist',
  reviewer: 'Reviewer',
  designer: 'Design team',
  viewer: 'Viewer',
}

/** Capabilities, each granted to a fixed set of roles. */
export const CAPABILITIES = {
  'project.read': ['owner', 'engineer', 'geologist', 'reviewer', 'designer', 'viewer'],
  'project.manage': ['owner'],
  'members.manage': ['owner'],
  'logs.write': ['owner', 'engineer', 'geologist'],
  'tests.write': ['owner', 'engineer', 'geologist'],
  'model.write': ['owner', 'engineer'],
  'interpretation.write': ['owner', 'engineer'],
  'review.write': ['owner', 'reviewer'],
  'review.reply': ['owner', 'engineer', 'geologist', 'reviewer'],
  'settlement.run': ['owner', 'engineer', 'designer'],
  'reports.issue': ['owner', 'engineer', 'designer'],
  'export.read': ['owner', 'engineer', 'geologist', 'reviewer', 'designer', 'viewer'],
} as const satisfies Record<string, readonly ProjectRole[]>

export type Capability = keyof typeof CAPABILITIES

export function roleCan(role: ProjectRole | null | undefined, capability: Capability): boolean {
  if (!role) return false
  return (CAPABILITIES[capability] as readonly ProjectRole[]).includes(role)
}

export const UNIT_SYSTEMS = ['SI', 'US'] as const
export type UnitSystemCode = (typeof UNIT_SYSTEMS)[number]
