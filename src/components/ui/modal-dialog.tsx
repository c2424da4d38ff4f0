import { useEffect, useId, type ReactNode, type RefObject } from 'react';

/**
 * A modal dialog over a dimmed page: named by its heading, the focus moved to `initialFocus` while it is
 * open and given back after; a click outside or Escape closes it.
 */
export function ModalDialog({
  title,
  onClose,
  initialFocus,
  className = 'max-w-md border-ink-700',
  heading,
  children,
}: {
  title: string;
  onClose: () => void;
  initialFocus: RefObject<HTMLElement | null>;
  className?: string;
  /** Beside the title (a close button) */
  heading?: ReactNode;
  children: ReactNode;
}) {
  const id = useId();
  useEffect(() => {
    const before = document.activeElement as HTMLElement | null;
    initialFocus.current?.focus();
    return () => before?.focus?.();
  }, [initialFocus]);
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink-950/70 p-4" onClick={onClose}>
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby={id}
        className={`w-full rounded-lg border bg-ink-900 p-5 shadow-2xl ${className}`}
        onClick={(e) => e.stopPropagation()}
        onKeyDown={(e) => e.key === 'Escape' && onClose()}
      >
        <div className="mb-3 flex items-center">
          <h2 id={id} className="text-base font-medium text-mist-100">
            {title}
          </h2>
          {heading}
        </div>
        {children}
      </div>
    </div>
  );
}

