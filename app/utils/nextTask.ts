/**
 * Resolves in the browser's next task, after the current one (and the rendering it queued) has finished. A message
 * to a channel of its own is a task without a timer's clamping: a timer in a background tab may wait a second.
 */
export function nextTask(): Promise<void> {
  return new Promise((resolve) => {
    const channel = new MessageChannel()
    channel.port1.onmessage = () => {
      channel.port1.close()
      resolve()
    }
    channel.port2.postMessage(null)
  })
}
