import { ref, toValue, type MaybeRefOrGetter } from 'vue'
import { downloadBlob, pngFromSvg } from '../utils/plotExport'

/**
 * Downloading a drawing as SVG or PNG (twice the size on screen): `svgText` builds the SVG text when
 * asked (it throws when the drawing is not ready), `name` is the file name without its ending.
 * `busy` while the PNG is made; `error` holds the last failure's words until the next try.
 */
export function useDrawingDownload(svgText: () => string, name: MaybeRefOrGetter<string>) {
  const busy = ref(false)
  const error = ref('')

  function failed(err: unknown) {
    error.value = err instanceof Error ? err.message : String(err)
  }
  function asSvg() {
    error.value = ''
    try {
      downloadBlob(new Blob([svgText()], { type: 'image/svg+xml' }), `${toValue(name)}.svg`)
    }
    catch (err) {
      failed(err)
    }
  }
  async function asPng() {
    error.value = ''
    busy.value = true
    try {
      downloadBlob(await pngFromSvg(svgText(), 2), `${toValue(name)}.png`)
    }
    catch (err) {
      failed(err)
    }
    finally {
      busy.value = false
    }
  }
  return { busy, error, asSvg, asPng }
}
