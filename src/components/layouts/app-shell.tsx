import { useEffect, useState } from 'react';
import { Link, Outlet, useNavigate } from 'react-router-dom';
import { applyTheme, chooseTheme, themeOf } from '../../lib/theme-preference';
import { useMe, useSignOut } from '../../features/auth/api/auth';
import { paths } from '../../config/paths';
import { Logo } from '../ui/logo';

export function AppShell() {
  const { data: me } = useMe();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const userId = me?.id ?? null;
  const [theme, setTheme] = useState(() => themeOf(userId));
  useEffect(() => {
    const t = themeOf(userId);
    setTheme(t);
    applyTheme(t);
  }, [userId]);
  const toggleTheme = () => {
    const next = theme === 'dark' ? 'light' : 'dark';
    chooseTheme(userId, next);
    setTheme(next);
  };
  return (
    <div className="flex min-h-screen flex-col">
      <header className="flex h-12 shrink-0 items-center gap-6 border-b border-ink-800 bg-ink-900 px-5">
        <Link to={paths.projects} className="flex items-center gap-2 text-accent">
          <Logo />
          <span className="text-base font-semibold tracking-wide text-mist-100">Fanlight</span>
        </Link>
        <nav className="flex gap-4 text-sm text-mist-300">
          <Link to={paths.projects} className="hover:text-mist-100">
            Projects
          </Link>
          <Link to={paths.bench} className="hover:text-mist-100">
            Bench
          </Link>
          {me?.siteRole === 'admin' && (
            <Link to={paths.adminUsers} className="hover:text-mist-100">
              Users
            </Link>
          )}
        </nav>
        <div className="ml-auto flex items-center gap-3 text-sm">
          <button
            type="button"
            className="rounded-md px-2 py-1 text-mist-300 hover:bg-ink-800 hover:text-mist-100"
            aria-pressed={theme === 'light'}
            title="Light or dark surfaces (remembered for you in this browser); the maps keep their colour scales"
            onClick={toggleTheme}
          >
            Light theme
          </button>
          <Link to={paths.settings} className="rounded-md px-2 py-1 text-mist-300 hover:bg-ink-800 hover:text-mist-100">
            Settings
          </Link>
          {me && (
            <span className="text-mist-300" data-testid="signed-in-as">
              {me.name} <span className="text-mist-500">· {me.siteRole}</span>
            </span>
          )}
          <button
            type="button"
            className="rounded-md px-2 py-1 text-mist-300 hover:bg-ink-800 hover:text-mist-100"
            onClick={() => signOut.mutate(undefined, { onSettled: () => navigate(paths.signIn) })}
          >
            Sign out
          </button>
        </div>
      </header>
      <main className="flex-1">
        <Outlet />
      </main>
    </div>
  );
}
