import { forwardRef, useId, type TextareaHTMLAttributes } from 'react';

interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  error?: string;
  hint?: string;
}

export const TextAreaField = forwardRef<HTMLTextAreaElement, TextAreaFieldProps>(function TextAreaField(
  { label, error, hint, className = '', rows = 3, ...props },
  ref,
) {
  const id = useId();
  const messageId = `${id}-message`;
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-mist-300">
        {label}
      </label>
      <textarea
        ref={ref}
        id={id}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={error || hint ? messageId : undefined}
        className={`rounded-md border bg-ink-900 px-3 py-2 text-sm text-mist-100 placeholder:text-mist-500 ${
          error ? 'border-danger' : 'border-ink-700 focus:border-accent'
        }`}
        {...props}
      />
      {error ? (
        <p id={messageId} className="text-xs text-danger" role="alert">
          {error}
        </p>
      ) : hint ? (
        <p id={messageId} className="text-xs text-mist-500">
          {hint}
        </p>
      ) : null}
    </div>
  );
});
