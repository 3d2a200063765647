import type { H3Event } from 'h3'

/** How long a refused sender may go on sending (dropped) after the answer, before its connection is closed. */
const LINGER_MS = 2000

/**
 * A body refused part-way (too large, unreadable): the rest is read and dropped as it arrives, so the sender
 * can finish writing and read the 4xx (closing at once resets the connection under the answer), and the
 * connection is closed shortly after the answer has gone, so an endless sender is cut off.
 */
export function dropRestOfBody(event: H3Event): void {
  const req = event.node.req
  req.resume()
  event.node.res.once('finish', () => setTimeout(() => {
    if (!req.complete) req.socket.destroy()
  }, LINGER_MS).unref())
}
