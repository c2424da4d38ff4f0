import { useId, type ReactNode } from 'react';

export interface FieldControlProps {
  id: string;
  'aria-invalid': true | undefined;
  'aria-describedby': string | undefined;
  className: string;
}

/**
 * The label, the control and its message (error or hint) that every form field shares; `control`
 * renders the input, textarea or select with the ids and classes given.
 */
export function FieldFrame({
  label,
  error,
  hint,
  className = '',
  placeholderClass = '',
  control,
}: {
  label: string;
  error?: string;
  hint?: string;
  className?: string;
  placeholderClass?: string;
  control: (props: FieldControlProps) => ReactNode;
}) {
  const id = useId();
  const messageId = `${id}-message`;
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="text-sm font-medium text-mist-300">
        {label}
      </label>
      {control({
        id,
        'aria-invalid': error ? true : undefined,
        'aria-describedby': error || hint ? messageId : undefined,
        className: `rounded-md border bg-ink-900 px-3 py-2 text-sm text-mist-100 ${placeholderClass} ${
          error ? 'border-danger' : 'border-ink-700 focus:border-accent'
        }`,
      })}
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
}
