import { describe, expect, it } from 'vitest'
import { oneAtATime } from '../../shared/one-at-a-time'

/** A promise and the function that settles it, to hold a round open. */
function gate() {
  let open!: () => void
  const done = new Promise<void>((r) => { open = r })
  return { done, open }
}

describe('oneAtATime', () => {
  it('folds calls made during a round into one more round after it', async () => {
    const gates = [gate(), gate()]
    let rounds = 0
    const run = oneAtATime(async () => {
      await gates[rounds++]?.done
    })
    const first = run()
    await run()
    await run()
    await run()
    expect(rounds).toBe(1)
    gates[0]!.open()
    gates[1]!.open()
    await first
    expect(rounds).toBe(2)
  })

  it('goes again while the work asks for it, until stopped', async () => {
    let rounds = 0
    let stop = false
    const run = oneAtATime(async () => {
      rounds++
      if (rounds === 3) stop = true
      return true
    }, () => stop)
    await run()
    expect(rounds).toBe(3)
  })

  it('passes an error to the caller and takes the next call afresh', async () => {
    let fail = true
    let rounds = 0
    const run = oneAtATime(async () => {
      rounds++
      if (fail) throw new Error('round failed')
    })
    await expect(run()).rejects.toThrow('round failed')
    fail = false
    await run()
    expect(rounds).toBe(2)
  })
})
