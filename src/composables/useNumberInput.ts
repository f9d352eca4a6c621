import { computed, ref, watch } from 'vue'
import { defaultText, helpText, ruleFor, typicalText, type ShowSystem } from '@shared/schemas/caseRules.ts'
import { fieldId } from '@/utils/fieldId.ts'

/** Parse typed text: spaces are thousands separators, a decimal comma counts as a point. */
export function parseNumberText(raw: string): number | null | 'invalid' {
  const s = raw.trim().replace(/\s/g, '').replace(',', '.')
  if (s === '') return null
  const n = Number(s)
  return Number.isFinite(n) ? n : 'invalid'
}

/** A number shown to `digits` significant digits, without trailing zeros. */
export function numberText(v: number, digits: number): string {
  return v === 0 ? '0' : String(Number(v.toPrecision(digits)))
}

type Emitted = number | null

/**
 * The input handling both number fields share: the text on screen, parsing what is typed, the
 * emit rules, and redisplaying the model when it changes from outside.
 *
 * Blank emits null. Letters emit NaN when `lettersAsNaN` (a case field: the form's check lists
 * them and nothing old is used), else they are refused here with "Enter a number". NaN in the
 * model stands for letters typed here, so the text stays. The model's echo of what this field
 * just emitted does not rewrite the text (4,5 stays 4,5); any other change, including one back
 * to a value emitted earlier, does.
 */
export function useNumberInput<M>(opts: {
  model: () => M | null | undefined
  /** The model as text, or '' when it cannot be shown (yet). */
  show: (value: M) => string
  /** A typed number as the value to emit, or null when it cannot be converted. */
  toModel: (typed: number) => number | null
  emit: (value: Emitted) => void
  lettersAsNaN: () => boolean
  errorMessages: () => string | string[] | undefined
}) {
  const text = ref('')
  const localError = ref('')
  const none = Symbol('none')
  /** What this field emitted and the model has not echoed yet. */
  let pending: Emitted | typeof none = none

  function send(value: Emitted): void {
    pending = value
    opts.emit(value)
  }

  function sync(): void {
    pending = none
    const v = opts.model()
    if (typeof v === 'number' && Number.isNaN(v)) return
    localError.value = ''
    text.value = v === null || v === undefined ? '' : opts.show(v)
  }

  watch(
    opts.model,
    (v) => {
      if (pending !== none && (Object.is(v, pending) || (v === undefined && pending === null))) {
        pending = none
        return
      }
      sync()
    },
    { deep: true },
  )

  function onInput(raw: string): void {
    text.value = raw
    const parsed = parseNumberText(raw)
    if (parsed === 'invalid') {
      if (opts.lettersAsNaN()) send(Number.NaN)
      else localError.value = 'Enter a number'
      return
    }
    localError.value = ''
    if (parsed === null) {
      send(null)
      return
    }
    const value = opts.toModel(parsed)
    if (value === null) localError.value = 'Cannot convert this value'
    else send(value)
  }

  const messages = computed(() => {
    const given = opts.errorMessages()
    const outside = given === undefined ? [] : Array.isArray(given) ? given : [given]
    return localError.value ? [localError.value, ...outside] : outside
  })

  return { text, messages, onInput, sync }
}

/**
 * What a case field (see shared/schemas/caseRules.ts) takes from its rule: the rule, the help
 * text with the typical range, and the engine's default as placeholder. `system` is the
 * person's unit system, null for a field in case units, undefined while units load.
 */
export function useCaseFieldRule(path: () => string | undefined, hint: () => string | undefined, system: () => ShowSystem | null | undefined) {
  const rule = computed(() => {
    const p = path()
    return p ? ruleFor(p) : undefined
  })
  const hintText = computed(() => {
    const given = hint()
    if (given !== undefined) return given
    const r = rule.value
    const sys = system()
    if (!r || sys === undefined) return r ? '' : undefined
    const typical = typicalText(r, sys)
    const help = helpText(r, sys)
    return typical ? `${help} Typical ${typical}.` : help
  })
  const placeholder = computed(() => {
    const sys = system()
    const d = rule.value && sys !== undefined ? defaultText(rule.value, sys, true) : ''
    return d ? `default: ${d}` : undefined
  })
  return { rule, hintText, placeholder }
}

/** The props both number fields have. */
export interface NumberFieldProps<M> {
  modelValue: M | null | undefined
  label?: string
  hint?: string
  errorMessages?: string | string[]
  /** The case path of the field (rules, help, default, id). */
  path?: string
}

/**
 * A number field: the typing rules (useNumberInput; letters emit NaN only for a case path), what
 * a case path brings (useCaseFieldRule), and `field`, the props both number fields bind on their
 * v-text-field. `show` and `toModel` convert between the model and the typed number; `system` is
 * the person's unit system, null for a field in case units, undefined while units load.
 */
export function useNumberField<M>(
  props: NumberFieldProps<M>,
  emit: (event: 'update:modelValue', value: number | null) => void,
  convert: { show: (value: M) => string; toModel: (typed: number) => number | null; system: () => ShowSystem | null | undefined },
) {
  const { rule, hintText, placeholder } = useCaseFieldRule(() => props.path, () => props.hint, convert.system)
  const { text, messages, onInput, sync } = useNumberInput<M>({
    model: () => props.modelValue,
    show: convert.show,
    toModel: convert.toModel,
    emit: (v) => emit('update:modelValue', v),
    lettersAsNaN: () => !!props.path,
    errorMessages: () => props.errorMessages,
  })
  const field = computed(() => ({
    id: props.path ? fieldId(props.path) : undefined,
    modelValue: text.value,
    label: props.label ?? rule.value?.label,
    hint: hintText.value,
    persistentHint: !!hintText.value,
    placeholder: placeholder.value,
    persistentPlaceholder: !!placeholder.value,
    errorMessages: messages.value,
    inputmode: 'decimal',
    class: 'app-number-field',
  }))
  return { rule, field, onInput, sync }
}
