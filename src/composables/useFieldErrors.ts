/**
 * Field-level error messages for a form: filled from an ApiError's `details` (each names a
 * field by its path), or set directly by the form's own checks. Messages for paths that match
 * no field of the form are kept in `formError` so nothing the server says is lost.
 */
import { reactive, ref } from 'vue';
import { ApiError, describeError } from '@/api/http';

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
      const top = detail.path.split('.')[0] as F;
      if (fields.includes(top)) {
        errors[top] = errors[top] ? `${errors[top]}; ${detail.message}` : detail.message;
      } else {
        unplaced.push(detail.path ? `${detail.path}: ${detail.message}` : detail.message);
      }
    }
    formError.value = unplaced.length > 0 ? `${error.message} (${unplaced.join('; ')})` : error.message;
    return true;
  }

  /** `validate-status` for an ant-design FormItem. */
  function status(field: F): 'error' | undefined {
    return errors[field] ? 'error' : undefined;
  }

  clear();
  return { errors, formError, clear, set, apply, status, any };
}
