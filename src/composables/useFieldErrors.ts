/**
 * Field-level error messages for a form: filled from an ApiError's `details` (each names a
 * field by its path), or set directly by the form's own checks. Messages for paths that match
 * no field of the form are kept in `formError` so nothing the server says is lost.
 */
import { reactive, ref, watch } from 'vue';
import { ApiError, describeError, fieldOf } from '@/api/http';

export function useFieldErrors<F extends string>(fields: readonly F[]) {
  const errors = reactive({}) as Record<F, string | undefined>;
  const formError = ref<string | null>(null);

  function clear(): void {
    for (const field of fields) errors[field] = undefined;
    formError.value = null;
  }

  function set(field: F, text: string | undefined): void {
    errors[field] = text;
  }

  /** True when any field or the form has a message. */
  function any(): boolean {
    return formError.value !== null || fields.some((f) => errors[f] !== undefined);
  }

  /** Spreads a thrown error over the fields; returns true when it was field-specific. */
  function apply(error: unknown): boolean {
    clear();
    if (!(error instanceof ApiError) || error.details.length === 0) {
      formError.value = describeError(error);
      return false;
    }
    const unplaced: string[] = [];
    for (const detail of error.details) {
      const field = fieldOf(detail.path) as F;
      if (fields.includes(field)) {
        errors[field] = errors[field] ? `${errors[field]}; ${detail.message}` : detail.message;
      } else {
        unplaced.push(field ? `${field}: ${detail.message}` : detail.message);
      }
    }
    formError.value =
      unplaced.length > 0
        ? `The server did not accept this: ${unplaced.join('; ')}`
        : 'Please correct the fields marked below.';
    return true;
  }

  /** `validate-status` for an ant-design FormItem. */
  function status(field: F): 'error' | undefined {
    return errors[field] ? 'error' : undefined;
  }

  /** Drops a field's message as soon as its value in `source` changes (the user is fixing it). */
  function clearOnEdit(source: Partial<Record<F, unknown>>): void {
    for (const field of fields) {
      watch(
        () => source[field],
        () => {
          errors[field] = undefined;
        },
        { deep: true },
      );
    }
  }

  clear();
  return { errors, formError, clear, set, apply, status, any, clearOnEdit };
}
