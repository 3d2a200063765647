// @vitest-environment happy-dom
import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, nextTick, ref } from 'vue'
import { useModalDialog } from '../../../app/composables/useModalDialog'

/** A dialog open while its `subject` prop is set, counting the resets its `onOpen` makes. */
const Dialog = defineComponent({
  props: { subject: { type: String, default: undefined }, immediate: Boolean },
  setup(props, { expose }) {
    const el = ref<HTMLDialogElement | null>(null)
    const resets = ref(0)
    useModalDialog(el, () => props.subject, { immediate: props.immediate, onOpen: () => { resets.value += 1 } })
    expose({ el, resets })
    return () => h('dialog', { ref: el })
  },
})

describe('useModalDialog', () => {
  it('opens as a modal when given a subject, resets on each new one, and closes when it is taken away', async () => {
    const w = mount(Dialog, { attachTo: document.body })
    const vm = w.vm as unknown as { el: HTMLDialogElement, resets: number }
    expect(vm.el.open).toBe(false)
    await w.setProps({ subject: 'BH-02 at 6 m' })
    await nextTick()
    expect(vm.el.open).toBe(true)
    expect(vm.resets).toBe(1)
    await w.setProps({ subject: 'BH-03 at 4 m' })
    await nextTick()
    expect(vm.el.open).toBe(true)
    expect(vm.resets).toBe(2)
    await w.setProps({ subject: undefined })
    expect(vm.el.open).toBe(false)
    w.unmount()
  })

  it('with immediate, a dialog mounted with a subject is open at once', async () => {
    const w = mount(Dialog, { props: { subject: 'CPT-01', immediate: true }, attachTo: document.body })
    await nextTick()
    const vm = w.vm as unknown as { el: HTMLDialogElement, resets: number }
    expect(vm.el.open).toBe(true)
    expect(vm.resets).toBe(1)
    w.unmount()
  })
})
