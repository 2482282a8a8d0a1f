'use client';
import { useState } from 'react';
import type { ThreadView } from '@/lib/discussion/thread-view';
import { buttonClass } from '@/components/ui/button';
import { ThreadPanel, type DiscussionPermissions, type DiscussionSubject } from './thread-panel';

/** "Discuss" with the number of open threads; opens the thread panel in place. */
export function DiscussButton({
  workspaceId,
  subject,
  title,
  threads,
  can,
  initiallyOpen = false,
}: {
  workspaceId: string;
  subject: DiscussionSubject;
  title: string;
  threads: ThreadView[];
  can: DiscussionPermissions;
  initiallyOpen?: boolean;
}) {
  const [open, setOpen] = useState(initiallyOpen);
  const openCount = threads.filter((t) => !t.resolvedAt).length;
  const label = openCount ? `${openCount} open thread${openCount === 1 ? '' : 's'}` : threads.length ? 'Discussion' : 'Discuss';
  return (
    <div className="space-y-2">
      <button
        type="button"
        className={buttonClass(openCount ? 'secondary' : 'ghost', 'px-2 py-0.5 text-xs')}
        aria-expanded={open}
        onClick={() => setOpen(!open)}
        data-testid="discuss"
        data-open-threads={openCount}
      >
        {label}
      </button>
      {open ? (
        <div className="min-w-[22rem]">
          <ThreadPanel workspaceId={workspaceId} subject={subject} title={title} threads={threads} can={can} />
        </div>
      ) : null}
    </div>
  );
}
