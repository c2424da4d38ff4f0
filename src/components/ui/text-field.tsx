import { forwardRef, type InputHTMLAttributes } from 'react';
import { FieldFrame } from './field-frame';

interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: string;
}

export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField(
  { label, error, hint, className, ...props },
  ref,
) {
  return (
    <FieldFrame
      label={label}
      error={error}
      hint={hint}
      className={className}
      placeholderClass="placeholder:text-mist-500"
      control={(field) => <input ref={ref} {...field} {...props} />}
    />
  );
});
