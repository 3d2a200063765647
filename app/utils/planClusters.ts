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

/**
 * A mark and its label's width (px) for {@link placeLabels}; `radius`, a mark drawn larger than the plan's usual;
 * `shortWidth`, the width of a shorter form of its label to try where the whole one finds no place.
 */
export interface LabelledMark extends PlacedMark { width: number, radius?: number, shortWidth?: number }

/** Where a mark's label went, and whether in its short form. */
export interface LabelPlace { side: LabelSide, short: boolean }

/** Where a mark's label goes: right of it (as drawn by default), left, above, below, or nowhere (it would cover another). */
export type LabelSide = 'right' | 'left' | 'above' | 'below' | 'none'

/**
 * The plan's label geometry (px): the gap between a mark's centre and its label beside it, the text's box above and
 * below its baseline (halo included), the mark's reach from its centre, and the plan's width.
 */
export interface LabelGeometry { gap: number, ascent: number, descent: number, markRadius: number, width: number }

interface Box { x0: number, y0: number, x1: number, y1: number }
const overlaps = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1

/**
 * Where a label on `side` is written from the centre of a mark of `radius`: the text's anchor point (baseline) and
 * alignment. Beside the mark the text is centred on it, `gap` from a mark of the usual size and as much further as
 * a larger mark reaches; above and below it clears the mark by 2 px.
 */
export function labelAnchor(side: Exclude<LabelSide, 'none'>, g: Omit<LabelGeometry, 'width'>, radius = g.markRadius): { x: number, y: number, anchor: 'start' | 'end' | 'middle' } {
  const beside = (g.ascent - g.descent) / 2
  const gap = g.gap + radius - g.markRadius
  if (side === 'right') return { x: gap, y: beside, anchor: 'start' }
  if (side === 'left') return { x: -gap, y: beside, anchor: 'end' }
  if (side === 'above') return { x: 0, y: -(radius + 2 + g.descent), anchor: 'middle' }
  return { x: 0, y: radius + 2 + g.ascent, anchor: 'middle' }
}

function labelBox(m: LabelledMark, width: number, side: Exclude<LabelSide, 'none'>, g: LabelGeometry): Box {
  const a = labelAnchor(side, g, m.radius)
  const x0 = a.anchor === 'start' ? m.x + a.x : a.anchor === 'end' ? m.x + a.x - width : m.x - width / 2
  return { x0, y0: m.y + a.y - g.ascent, x1: x0 + width, y1: m.y + a.y + g.descent }
}

const SIDES = ['right', 'left', 'above', 'below'] as const

/**
 * Labels that cover no other mark and no label placed before them: each mark in the order given (the first have
 * the first choice) takes the first free side of right, left, above and below that lies inside the plan's width,
 * then the same for its short form if it has one, else shows no label (the mark stays, named by its accessible
 * name and the list beside the plan).
 */
export function placeLabels(marks: readonly LabelledMark[], g: LabelGeometry): Map<string, LabelPlace> {
  const marksBoxes = marks.map((m) => {
    const r = m.radius ?? g.markRadius
    return { id: m.id, box: { x0: m.x - r, y0: m.y - r, x1: m.x + r, y1: m.y + r } }
  })
  const placed: Box[] = []
  const out = new Map<string, LabelPlace>()
  for (const m of marks) {
    const free = (b: Box) => b.x0 >= 0 && b.x1 <= g.width && !placed.some(p => overlaps(p, b)) && !marksBoxes.some(o => o.id !== m.id && overlaps(o.box, b))
    const forms = m.shortWidth === undefined ? [m.width] : [m.width, m.shortWidth]
    let place: LabelPlace = { side: 'none', short: false }
    search: for (const [k, width] of forms.entries()) {
      for (const side of SIDES) {
        const b = labelBox(m, width, side, g)
        if (free(b)) {
          place = { side, short: k > 0 }
          placed.push(b)
          break search
        }
      }
    }
    out.set(m.id, place)
  }
  return out
}
