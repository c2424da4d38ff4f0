import { forwardRef, type TextareaHTMLAttributes } from 'react';
import { FieldFrame } from './field-frame';

interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  error?: string;
  hint?: string;
}

export const TextAreaField = forwardRef<HTMLTextAreaElement, TextAreaFieldProps>(function TextAreaField(
  { label, error, hint, className, rows = 3, ...props },
  ref,
) {
  return (
    <FieldFrame
      label={label}
      error={error}
      hint={hint}
      className={className}
      placeholderClass="placeholder:text-mist-500"
      control={(field) => <textarea ref={ref} rows={rows} {...field} {...props} />}
    />
  );
});
