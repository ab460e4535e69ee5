import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '@/lib/api-client';

/**
 * Puts the server's field messages beside the fields and returns the message for the form as a
 * whole. The form's values are left alone, so nothing typed is lost.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  known: readonly string[],
): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Please try again.';
  let placed = false;
  for (const [field, message] of Object.entries(error.fields)) {
    if (known.includes(field)) {
      setError(field as Path<T>, { type: 'server', message });
      placed = true;
    }
  }
  return placed && Object.keys(error.fields).length === 1 ? '' : error.message;
}
