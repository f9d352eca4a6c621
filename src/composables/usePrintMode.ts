import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue'

/**
 * True from the moment the page is printed (or shown in print media) on: views render the
 * sections they keep lazy (the workspace's tabs) so that paper carries all of them. It stays
 * true afterwards; the sections are then only mounted, and hidden on screen as before.
 */
export function usePrintMode(): Readonly<Ref<boolean>> {
  const printing = ref(false)
  const mq = typeof window !== 'undefined' && typeof window.matchMedia === 'function' ? window.matchMedia('print') : null
  const sync = () => {
    if (mq?.matches) printing.value = true
  }
  const before = () => {
    printing.value = true
  }
  onMounted(() => {
    sync()
    mq?.addEventListener('change', sync)
    window.addEventListener('beforeprint', before)
  })
  onBeforeUnmount(() => {
    mq?.removeEventListener('change', sync)
    window.removeEventListener('beforeprint', before)
  })
  return printing
}
