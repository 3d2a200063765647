import { computed, useAttrs } from 'vue'

/**
 * For a field component with `inheritAttrs: false`: the class given to it (for its box, a grid
 * span or a width) apart from every other attribute (for the control inside).
 */
export function useFieldAttrs() {
  const attrs = useAttrs()
  const boxClass = computed(() => attrs.class)
  const controlAttrs = computed(() => {
    const { class: _box, ...rest } = attrs
    return rest
  })
  return { boxClass, controlAttrs }
}
