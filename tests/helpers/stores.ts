// Pinia stores in happy-dom unit tests.
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach } from 'vitest'

/** Each test of the describe block this is called in starts with empty local and session storage and a fresh Pinia. */
export function useFreshStores(): void {
  beforeEach(() => {
    localStorage.clear()
    sessionStorage.clear()
    setActivePinia(createPinia())
  })
}
