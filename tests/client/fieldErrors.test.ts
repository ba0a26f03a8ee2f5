// @vitest-environment happy-dom
/**
 * Field messages from the API's error details land beside the matching form fields; a detail
 * that names no field of the form is kept in the form-level message; a message goes away as
 * soon as its field is edited.
 */
import { describe, expect, it } from 'vitest';
import { nextTick, reactive } from 'vue';
import { ApiError } from '@/api/http';
import { useFieldErrors } from '@/composables/useFieldErrors';

describe('useFieldErrors', () => {
  it('places each detail beside its field and keeps the rest at form level', () => {
    const fe = useFieldErrors(['name', 'units', 'notes'] as const);
    const placed = fe.apply(
      new ApiError(400, 'validation_failed', 'body.name: too long; body: unknown field(s): colour', [
        { path: 'body.name', message: 'name may have at most 200 characters' },
        { path: 'body.name', message: 'name must not be blank' },
        { path: 'body', message: 'unknown field(s): colour' },
      ]),
    );
    expect(placed).toBe(true);
    expect(fe.errors.name).toBe('name may have at most 200 characters; name must not be blank');
    expect(fe.status('name')).toBe('error');
    expect(fe.errors.units).toBeUndefined();
    expect(fe.status('units')).toBeUndefined();
    expect(fe.formError.value).toBe('The server did not accept this: unknown field(s): colour');
  });

  it('uses the message itself when the error names no field', () => {
    const fe = useFieldErrors(['name'] as const);
    expect(fe.apply(new ApiError(409, 'conflict', 'A project with this name exists.'))).toBe(false);
    expect(fe.errors.name).toBeUndefined();
    expect(fe.formError.value).toBe('A project with this name exists.');
    fe.apply(new Error('boom'));
    expect(fe.formError.value).toBe('Boom.');
  });

  it('clears a field message when that field is edited, and only that one', async () => {
    const draft = reactive({ name: '', units: 'US' });
    const fe = useFieldErrors(['name', 'units'] as const);
    fe.clearOnEdit(draft);
    fe.set('name', 'Give the project a name.');
    fe.set('units', 'Choose US customary or SI units.');
    draft.name = 'Quarry Creek';
    await nextTick();
    expect(fe.errors.name).toBeUndefined();
    expect(fe.errors.units).toBe('Choose US customary or SI units.');
    expect(fe.any()).toBe(true);
  });
});
