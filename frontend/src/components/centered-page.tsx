import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Brand } from './brand';
import { CautionNote } from './caution-note';

/** The frame for pages outside an organization: sign-in, password reset, invitations, 404. */
export function CenteredPage({ children, wide = false }: { children: ReactNode; wide?: boolean }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="px-6 pt-8 pb-4 text-center">
        <Link to="/" className="inline-block no-underline hover:no-underline">
          <Brand />
        </Link>
      </header>
      <main id="main" tabIndex={-1} className={`mx-auto w-full flex-1 px-4 pb-10 ${wide ? 'max-w-2xl' : 'max-w-md'}`}>
        {children}
      </main>
      <footer className="mx-auto w-full max-w-2xl px-6 pb-6 text-center">
        <CautionNote variant="footer" />
      </footer>
    </div>
  );
}
