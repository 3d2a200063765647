/** The kinds of notice a person gets, in the inbox and by e-mail. */
export const NOTIFICATION_KINDS = [
  'review-requested',
  'version-approved',
  'version-returned',
  'flag-raised',
  'flag-reply',
  'invitation',
  'password-reset',
  'member-added',
] as const
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number]

/** How a person wants a kind of e-mail: at once or not at all (the inbox always has it). */
export const NOTIFICATION_MODES = ['immediate', 'off'] as const
export type NotificationMode = (typeof NOTIFICATION_MODES)[number]

/** Kinds a person may turn off: account mail (invitation, password reset) always goes out. */
export const OPTIONAL_NOTIFICATION_KINDS = [
  'review-requested',
  'version-approved',
  'version-returned',
  'flag-raised',
  'flag-reply',
  'member-added',
] as const satisfies readonly NotificationKind[]

export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  'review-requested': 'A version is sent to you for review',
  'version-approved': 'A version you submitted or work on is approved',
  'version-returned': 'A version you submitted or work on is returned',
  'flag-raised': 'A flag is raised on your test or logged interval',
  'flag-reply': 'A reply in a flag thread you are in',
  'invitation': 'Invitations',
  'password-reset': 'Password reset',
  'member-added': 'You are added to a project',
}
