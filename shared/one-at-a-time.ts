/**
 * `work` run at most once at a time. A call while it runs asks for one more run right after it
 * (any number of calls meanwhile fold into that one run), and `work` may ask for another itself by
 * returning true; `stopped` ends the repeats. An error ends the round and reaches the call that
 * started it. Used where a burst of triggers must not start the work over and over (live refreshes
 * on a page, the mail outbox's delivery rounds).
 */
export function oneAtATime(work: () => Promise<boolean | void>, stopped: () => boolean = () => false): () => Promise<void> {
  let running = false
  let again = false
  return async () => {
    if (running) {
      again = true
      return
    }
    running = true
    try {
      do {
        again = false
        if (await work()) again = true
      } while (again && !stopped())
    }
    finally {
      running = false
    }
  }
}
