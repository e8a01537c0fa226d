import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getMailForMember, listMailPageForMember } from '@/db/queries';
import { pageParam } from '@/lib/paging';
import { Pager } from '@/components/ui/pager';
import { requireUser } from '@/lib/auth';
import { formatDate } from '@/components/review/format';

export const metadata: Metadata = { title: 'Mailbox' };

/**
 * The signed-in user's own mail about their current team, as caught by the
 * local fake mail server. Only in the demo (PHASEWRIGHT_DEMO=1), for every
 * signed-in member; elsewhere the page does not exist.
 */
export default async function MailboxPage({ searchParams }: { searchParams: Promise<{ m?: string; page?: string }> }) {
  const user = await requireUser();
  if (process.env.PHASEWRIGHT_DEMO !== '1') notFound();
  const { m, page } = await searchParams;
  const db = getDb();
  // 100 messages a page, newest first; the page is in the URL, so Back and links keep it.
  const list = listMailPageForMember(db, user.email, user.teamId, pageParam(page));
  const messages = list.messages;
  const pageQuery = list.page > 1 ? `page=${list.page}&` : '';
  const openId = m && /^\d{1,12}$/.test(m) ? Number(m) : messages[0]?.id;
  const open = (openId === undefined ? undefined : getMailForMember(db, openId, user.email, user.teamId)) ?? (messages[0] ? getMailForMember(db, messages[0].id, user.email, user.teamId) : undefined);

  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-semibold">Mailbox</h1>
        <p className="text-sm text-slate-500">
          Demo only: the mail Phasewright sent you ({user.email}) about {user.teamName}, caught by the local fake mail server on 127.0.0.1:
          {process.env.SMTP_PORT ?? '—'}. Nothing leaves this machine.
        </p>
      </div>
      {messages.length === 0 ? (
        <div className="card p-8 text-center text-slate-600">No mail for you yet. Mail arrives when someone asks you to review or decides on your revision.</div>
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(280px,2fr)_3fr]">
          <ol className="card divide-y divide-slate-100 self-start overflow-hidden" data-testid="mail-list">
            {messages.map((msg) => (
              <li key={msg.id}>
                <Link
                  href={`/mailbox?${pageQuery}m=${msg.id}`}
                  scroll={false}
                  className={`block px-3 py-2 text-sm ${open?.id === msg.id ? 'bg-indigo-50' : 'hover:bg-slate-50'}`}
                  aria-current={open?.id === msg.id ? 'true' : undefined}
                >
                  <div className="flex gap-2 text-xs text-slate-500">
                    <span className="truncate">to {msg.toAddress}</span>
                    <span className="num ml-auto whitespace-nowrap">{formatDate(msg.createdAt)}</span>
                  </div>
                  <div className="truncate font-medium text-slate-900">{msg.subject || '(no subject)'}</div>
                </Link>
              </li>
            ))}
            <li>
              <Pager page={list.page} lastPage={list.lastPage} total={list.total} noun="messages" href={(n) => `/mailbox?page=${n}`} testId="mail-pager" />
            </li>
          </ol>
          {open && (
            <article className="card overflow-hidden" data-testid="mail-open">
              <header className="space-y-0.5 border-b border-slate-200 px-4 py-3 text-sm">
                <h2 className="text-lg font-semibold">{open.subject || '(no subject)'}</h2>
                <div className="text-slate-600">
                  From {open.fromAddress} · to {open.toAddress} · {formatDate(open.createdAt)}
                </div>
              </header>
              {open.html ? (
                <iframe
                  title="HTML part"
                  // No scripts; links open in a new tab.
                  sandbox="allow-popups allow-popups-to-escape-sandbox"
                  srcDoc={`<base target="_blank">${open.html}`} className="h-[360px] w-full border-0 bg-white" />
              ) : null}
              <details className="border-t border-slate-200 px-4 py-3 text-sm" open={!open.html}>
                <summary className="cursor-pointer font-medium text-slate-600">Plain-text part</summary>
                <pre className="mt-2 whitespace-pre-wrap font-mono text-xs text-slate-800">{open.text}</pre>
              </details>
            </article>
          )}
        </div>
      )}
    </div>
  );
}
