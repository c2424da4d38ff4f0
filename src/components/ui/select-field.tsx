import { forwardRef, type SelectHTMLAttributes } from 'react';
import { FieldFrame } from './field-frame';

interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
}

export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, error, className, children, ...props },
  ref,
) {
  return (
    <FieldFrame
      label={label}
      error={error}
      className={className}
      control={(field) => (
        <select ref={ref} {...field} {...props}>
          {children}
        </select>
      )}
    />
  );
});
