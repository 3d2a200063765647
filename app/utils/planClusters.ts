/** A point's mark where the plan draws it, in screen pixels. */
export interface PlacedMark { id: string, x: number, y: number }

/** How near (px) another mark must be, across and up or down, to be drawn into a mark's group. */
export interface ClusterReach { across: number, upDown: number }

/**
 * Marks drawn too close to tell apart (their symbols or their labels, which run to the right, would
 * overlap), gathered so the plan can draw each group as one mark that opens a list. Two marks within
 * `reach` of each other are in one group, and so are marks joined through others (a row of marks each
 * touching the next is one group: drawn apart, each label would run into the next mark). Groups keep
 * the order the marks are given in (the plan gives them by identifier); only groups of two or more are
 * returned, their first mark (the one drawn) first.
 */
export function clusterMarks(marks: readonly PlacedMark[], reach: ClusterReach): string[][] {
  interface Node { mark: PlacedMark, order: number, up: Node | null }
  const nodes: Node[] = marks.map((mark, order) => ({ mark, order, up: null }))
  const root = (n: Node): Node => {
    let r = n
    while (r.up) r = r.up
    for (let c: Node | null = n; c && c !== r;) [c.up, c] = [r, c.up]
    return r
  }
  // Sorted across, each mark is compared only with the marks within reach to its right.
  const across = [...nodes].sort((a, b) => a.mark.x - b.mark.x)
  across.forEach((a, k) => {
    for (let l = k + 1; l < across.length; l++) {
      const b = across[l]
      if (!b || b.mark.x - a.mark.x > reach.across) break
      if (Math.abs(b.mark.y - a.mark.y) > reach.upDown) continue
      const ra = root(a)
      const rb = root(b)
      // A group's root is its earliest mark in the given order.
      if (ra !== rb) {
        if (ra.order < rb.order) rb.up = ra
        else ra.up = rb
      }
    }
  })
  const groups = new Map<Node, string[]>()
  for (const n of nodes) {
    const r = root(n)
    const g = groups.get(r)
    if (g) g.push(n.mark.id)
    else groups.set(r, [n.mark.id])
  }
  return [...groups.values()].filter(g => g.length > 1)
}
