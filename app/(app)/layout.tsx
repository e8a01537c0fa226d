import Link from 'next/link';
import { redirect } from 'next/navigation';
import { getCurrentUser } from '@/lib/auth';
import { Logo } from '@/components/ui/logo';
import { TeamSwitcher } from '@/components/team-switcher';
import { UserMenu } from '@/components/user-menu';

// Every page in this group needs a session; the check runs on the server.
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await getCurrentUser();
  if (!user) redirect('/signin');
  const demo = process.env.PHASEWRIGHT_DEMO === '1';
  return (
    <div className="flex min-h-screen flex-col">
      <header className="bg-frame text-slate-100 shadow">
        <div className="mx-auto flex h-14 max-w-[1600px] items-center gap-6 px-4">
          <Link href="/designs" className="text-white">
            <Logo />
          </Link>
          <nav className="flex items-center gap-1 text-sm">
            <NavLink href="/designs">Designs</NavLink>
            <NavLink href="/cautions">Limits and cautions</NavLink>
            {user.role === 'admin' && <NavLink href="/admin">Team</NavLink>}
            {demo && <NavLink href="/mailbox">Mailbox</NavLink>}
          </nav>
          <div className="ml-auto flex items-center gap-3">
            <TeamSwitcher current={user.teamId} teams={user.teams} />
            <UserMenu name={user.name} email={user.email} role={user.role} />
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-[1600px] flex-1 px-4 py-6">{children}</main>
    </div>
  );
}

function NavLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <Link href={href} className="rounded-md px-3 py-1.5 text-slate-200 hover:bg-frame-light hover:text-white">
      {children}
    </Link>
  );
}
