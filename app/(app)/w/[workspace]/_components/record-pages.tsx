import Link from 'next/link';
import { Notice } from '@/components/ui/notice';

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** The frame of a catalogue record's edit page (material, method, source): back link, title, and no form while retracted. */
export function EditRecordFrame({ backHref, name, noun, retracted, children }: { backHref: string; name: string; noun: string; retracted: boolean; children: React.ReactNode }) {
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={backHref}>← {name}</Link>
      </p>
      <h1>Edit {name}</h1>
      {retracted ? <Notice tone="warn">This {noun} is retracted. Restore it on its page before editing.</Notice> : children}
    </div>
  );
}

/** The notice a retracted record's page shows under its header. */
export function RetractedNotice({ at, reason }: { at: Date | null; reason: string | null }) {
  if (!at) return null;
  return (
    <Notice tone="warn">
      Retracted {dateFormat.format(at)}: {reason}
    </Notice>
  );
}

/** When a record was added and last edited, under its title. */
export function RecordDates({ createdAt, updatedAt }: { createdAt: Date; updatedAt: Date | null }) {
  return (
    <p className="text-xs text-ink-faint">
      Added {dateFormat.format(createdAt)}
      {updatedAt ? ` · edited ${dateFormat.format(updatedAt)}` : ''}
    </p>
  );
}
