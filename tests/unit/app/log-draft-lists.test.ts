// @vitest-environment happy-dom
import { mount } from '@vue/test-utils'
import { defineComponent, h, nextTick, type Ref, vModelSelect, withDirectives } from 'vue'
import { describe, expect, it, vi } from 'vitest'

// What Nuxt auto-imports into the composable; routing and the network are not used here.
vi.stubGlobal('onBeforeRouteLeave', () => {})
vi.stubGlobal('onBeforeRouteUpdate', () => {})
vi.stubGlobal('api', async () => ({}))
vi.stubGlobal('pointUrl', (p: string, q: string) => `/api/projects/${p}/points/${q}`)
/** What the test uses of the draft (the composable itself leans on Nuxt's auto-imports, which the tests' type check does not see). */
interface Draft {
  rows: Ref<{ key: string, uscs: string }[]>
  dirty: Ref<boolean>
  canUndo: Ref<boolean>
  undo: () => void
  onCellEdit: (e?: Event) => void
  onCellFocus: () => void
}
const COMPOSABLE = '../../../app/composables/useLogDraft'
const { useLogDraft } = await import(/* @vite-ignore */ COMPOSABLE) as { useLogDraft: (source: unknown, hooks: unknown) => Draft }

const interval = { id: 'a1', version: 1, top: 0, bottom: 1.2, description: 'Brown sandy GRAVEL (fill)', uscs: null, stratumId: null, moisture: null, consistency: null }

/**
 * The log table's wiring in small: a USCS list bound with v-model (which listens to `change`),
 * the rows' `input` and `change` going to the draft. A browser reports a choice made with the
 * keyboard as `input`, runs pending work (Vue's redraw), then `change`.
 */
function mountTable() {
  let draft!: Draft
  const Table = defineComponent({
    setup() {
      draft = useLogDraft(
        { projectId: 'p', pointId: 'q', identifier: 'BH-K1', finalDepth: 10, intervals: [interval], strata: [], canEdit: true },
        { draft: () => {}, saved: () => {}, stale: () => {}, focusCell: () => {} },
      )
      return () => h('table', [h('tbody', { onInput: draft.onCellEdit, onChange: draft.onCellEdit, onFocusin: draft.onCellFocus }, draft.rows.value.map((r, i) => h('tr', { key: r.key }, [
        h('td', [withDirectives(h('select', { 'data-row': i, 'data-col': 'uscs', 'onUpdate:modelValue': (v: string) => { r.uscs = v } }, ['', 'GW', 'CH'].map(v => h('option', { value: v }, v || '—'))), [[vModelSelect, r.uscs]])]),
        // Something the first edit changes, so the table redraws between the two events.
        h('td', draft.canUndo.value ? 'edited' : ''),
      ])))])
    },
  })
  const wrapper = mount(Table, { attachTo: document.body })
  return { wrapper, draft: () => draft }
}

describe('the log draft\'s lists', () => {
  it('keeps a choice reported as input, then change, with a redraw in between (the keyboard\'s order)', async () => {
    const { wrapper, draft } = mountTable()
    const select = wrapper.find('select').element as HTMLSelectElement
    select.dispatchEvent(new FocusEvent('focusin', { bubbles: true }))
    select.value = 'GW'
    select.dispatchEvent(new Event('input', { bubbles: true }))
    await nextTick()
    expect(wrapper.text()).toContain('edited')
    select.dispatchEvent(new Event('change', { bubbles: true }))
    await nextTick()
    expect(select.value).toBe('GW')
    expect(draft().rows.value[0]?.uscs).toBe('GW')
    expect(draft().dirty.value).toBe(true)
    // One edit to undo, back to no symbol.
    draft().undo()
    await nextTick()
    expect(draft().rows.value[0]?.uscs).toBe('')
    wrapper.unmount()
  })

  it('keeps a choice whose two events arrive together (a pick with the mouse)', async () => {
    const { wrapper, draft } = mountTable()
    const select = wrapper.find('select').element as HTMLSelectElement
    select.value = 'CH'
    select.dispatchEvent(new Event('input', { bubbles: true }))
    select.dispatchEvent(new Event('change', { bubbles: true }))
    await nextTick()
    expect(select.value).toBe('CH')
    expect(draft().rows.value[0]?.uscs).toBe('CH')
    wrapper.unmount()
  })
})
