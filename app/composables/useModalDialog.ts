import { nextTick, onMounted, watch, type Ref } from 'vue'

/**
 * A `<dialog>` shown as a modal while `openWhen()` gives something, closed when it gives nothing.
 * `onOpen` runs each time it opens (or is given something new), before the dialog is shown: the
 * place to reset its fields. `immediate`: it also opens when the component mounts already open.
 */
export function useModalDialog(dialog: Ref<HTMLDialogElement | null>, openWhen: () => unknown, options: { onOpen?: () => void, immediate?: boolean } = {}) {
  function show() {
    if (dialog.value && !dialog.value.open) dialog.value.showModal()
  }
  watch(openWhen, async (value) => {
    if (value) {
      options.onOpen?.()
      await nextTick()
      show()
    }
    else if (dialog.value?.open) {
      dialog.value.close()
    }
  }, { immediate: options.immediate ?? false })
  if (options.immediate) {
    onMounted(() => {
      if (openWhen()) show()
    })
  }
}
