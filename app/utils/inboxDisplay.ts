import type { NotificationKind } from '#shared/notifications/kinds'

/** The short tag of each kind of notice in the inbox list. */
export const INBOX_KIND_TAGS: Record<NotificationKind, string> = {
  'review-requested': 'Review request',
  'version-approved': 'Approved',
  'version-returned': 'Returned',
  'flag-raised': 'Flag',
  'flag-reply': 'Reply',
  'invitation': 'Invitation',
  'password-reset': 'Password',
  'member-added': 'Project access',
}

/** Only app paths are followed from the inbox (a stored link is never another site's). */
export function inboxTarget(link: string): string {
  return link.startsWith('/') && !link.startsWith('//') ? link : '/'
}
