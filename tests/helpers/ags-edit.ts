// Editing an exported AGS4 text row by row, by group and heading, for tests of imports that update holes.

/** The fields of an AGS4 line ("DATA","BH-01",…), and back. */
export const agsFields = (line: string) => line.slice(1, -1).split('","')
export const agsLine = (f: string[]) => `"${f.join('","')}"`

/** An AGS4 text as lines, with the headings of each group, to edit rows by heading. */
export function editableAgs(text: string) {
  const lines = text.split(/\r?\n/)
  const groupAt = (i: number) => {
    for (let j = i; j >= 0; j--) if (lines[j]!.startsWith('"GROUP"')) return agsFields(lines[j]!)[1]!
    return ''
  }
  const headings = (group: string) => {
    const g = lines.findIndex(l => l === `"GROUP","${group}"`)
    return g < 0 ? [] : agsFields(lines[g + 1]!)
  }
  /** Indexes (0-based) of a group's DATA lines for one hole. */
  const rows = (group: string, loca: string) => lines.map((l, i) => ({ l, i })).filter(({ l, i }) => l.startsWith(`"DATA","${loca}",`) && groupAt(i) === group).map(r => r.i)
  return { lines, headings, rows, text: () => lines.join('\r\n') }
}

/**
 * BH-01 edited: its second interval described anew, the hole 2 m deeper with one more interval at
 * its foot (invented text). Returns the new text, the new description and the new final depth.
 */
export function editBh01(original: string) {
  const e = editableAgs(original)
  const geol = e.headings('GEOL')
  const [top, baseCol, desc] = ['GEOL_TOP', 'GEOL_BASE', 'GEOL_DESC'].map(h => geol.indexOf(h))
  const bh = e.rows('GEOL', 'BH-01')
  const second = agsFields(e.lines[bh[1]!]!)
  const editedDescription = `${second[desc!]} Edited after review.`
  second[desc!] = editedDescription
  e.lines[bh[1]!] = agsLine(second)
  const last = agsFields(e.lines[bh.at(-1)!]!)
  const oldBase = Number(last[baseCol!])
  const newFinalDepth = oldBase + 2
  const added = [...last]
  added[top!] = oldBase.toFixed(2)
  added[baseCol!] = newFinalDepth.toFixed(2)
  added[desc!] = 'Very dense grey sandy gravel.'
  e.lines.splice(bh.at(-1)! + 1, 0, agsLine(added))
  const loca = e.headings('LOCA')
  const [locaRow] = e.rows('LOCA', 'BH-01')
  const lf = agsFields(e.lines[locaRow!]!)
  lf[loca.indexOf('LOCA_FDEP')] = newFinalDepth.toFixed(2)
  e.lines[locaRow!] = agsLine(lf)
  return { text: e.text(), editedDescription, newFinalDepth }
}
