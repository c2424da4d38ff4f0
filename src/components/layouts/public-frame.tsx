import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../config/paths';
import { Logo } from '../ui/logo';

/** The narrow, centred frame of the pages one opens without a session (reset, invitation). */
export function PublicFrame({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen items-center justify-center px-4 py-10">
      <div className="w-full max-w-sm">
        <Link to={paths.signIn} className="mb-8 flex items-center gap-3 text-accent">
          <Logo className="h-9 w-9" />
          <div>
            <p className="text-2xl font-semibold text-mist-100">Fanlight</p>
            <p className="text-sm text-mist-500">Noise and vibration of electric drives</p>
          </div>
        </Link>
        {children}
      </div>
    </div>
  );
}
