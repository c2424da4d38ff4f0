import { forwardRef, useId, type SelectHTMLAttributes } from 'react';

interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
}

export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, error, className = '', children, ...props },
  ref,
) {
  const id = useId();
  const messageId = `${id}-message`;
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-mist-300">
        {label}
      </label>
      <select
        ref={ref}
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? messageId : undefined}
        className={`rounded-md border bg-ink-900 px-3 py-2 text-sm text-mist-100 ${
          error ? 'border-danger' : 'border-ink-700 focus:border-accent'
        }`}
        {...props}
      >
        {children}
      </select>
      {error && (
        <p id={messageId} className="text-xs text-danger" role="alert">
          {error}
        </p>
      )}
    </div>
  );
});
