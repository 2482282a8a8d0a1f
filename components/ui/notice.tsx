type Tone = 'info' | 'good' | 'warn' | 'bad';

const TONES: Record<Tone, string> = {
  info: 'border-accent/30 bg-accent-soft text-accent-strong',
  good: 'border-good/30 bg-good-soft text-good',
  warn: 'border-warn/30 bg-warn-soft text-warn',
  bad: 'border-bad/30 bg-bad-soft text-bad',
};

export function Notice({ tone = 'info', children, role }: { tone?: Tone; children: React.ReactNode; role?: 'alert' | 'status' }) {
  return (
    <div className={`rounded-md border px-3 py-2 text-sm ${TONES[tone]}`} role={role ?? (tone === 'bad' ? 'alert' : 'status')}>
      {children}
    </div>
  );
}
