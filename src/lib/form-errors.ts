import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/** Puts the server's per-field messages on the form's fields; returns the message for the whole form. */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): string {
  if (error instanceof ApiError) {
    for (const [field, message] of Object.entries(error.fields)) {
      setError(field as Path<T>, { type: 'server', message });
    }
    return error.message;
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}
