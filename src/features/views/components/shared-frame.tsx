import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Logo } from '../../../components/ui/logo';
import { paths } from '../../../config/paths';

/** The wide frame of a view opened through a share link: no account, so no app navigation. */
export function SharedFrame({ projectName, children }: { projectName: string; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="flex items-center gap-6 border-b border-ink-800 bg-ink-900 px-5 py-2.5">
        <span className="flex items-center gap-2 text-accent">
          <Logo />
          <span className="text-base font-semibold tracking-wide text-mist-100">Fanlight</span>
        </span>
        <span className="text-sm text-mist-300">
          Shared view <span className="text-mist-500">from</span> {projectName}
        </span>
        <Link to={paths.signIn} className="ml-auto text-sm text-mist-300 hover:text-mist-100">
          Sign in
        </Link>
      </header>
      <main className="flex-1">{children}</main>
    </div>
  );
}
