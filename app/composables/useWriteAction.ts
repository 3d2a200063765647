import { ref, type Ref } from 'vue'
import { apiErrorMessage } from '../utils/apiErrors'

export interface WriteOptions<T> {
  /** The notice shown when the write succeeds. */
  done?: string | ((result: T) => string)
  /** Handles a failure itself (a stale write, field errors); return true to keep it out of `error`. */
  onError?: (err: unknown) => boolean | void
}

export interface WriteAction {
  busy: Ref<boolean>
  error: Ref<string>
  notice: Ref<string>
  /** Clears the last error and notice (before a form's own checks). */
  clear: () => void
  /** Runs one write: clears the last message, holds `busy`, sets the notice or the server's message. True when it succeeded. */
  run: <T>(action: () => Promise<T>, options?: WriteOptions<T>) => Promise<boolean>
}

/** The busy flag, error and notice every form around a write keeps, in one place. */
export function useWriteAction(): WriteAction {
  const busy = ref(false)
  const error = ref('')
  const notice = ref('')

  function clear() {
    error.value = ''
    notice.value = ''
  }

  async function run<T>(action: () => Promise<T>, options: WriteOptions<T> = {}): Promise<boolean> {
    clear()
    busy.value = true
    try {
      const result = await action()
      if (options.done) notice.value = typeof options.done === 'function' ? options.done(result) : options.done
      return true
    }
    catch (err) {
      if (!options.onError?.(err)) error.value = apiErrorMessage(err)
      return false
    }
    finally {
      busy.value = false
    }
  }

  return { busy, error, notice, clear, run }
}
