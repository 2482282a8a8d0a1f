import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { getSession } from '@/lib/session';
import { buttonClass } from '@/components/ui/button';
import { SpectrumMark } from '@/components/front/spectrum-mark';

export const metadata: Metadata = { title: { absolute: 'Lattice Ledger — computed phonons held against experiment' } };

const WHO: Array<{ who: string; what: string }> = [
  { who: 'Method developers', what: 'Push mode lists and entropies from a workflow (CSV or API) and see which recipe reproduces experiment best, with intervals, per material class.' },
  { who: 'Experimentalists', what: 'Add Raman, IR and neutron peaks and calorimetric entropies with uncertainty and a citation on every row, and see where theory disagrees.' },
  { who: 'Group meetings', what: 'Review parity plots and outliers together, record a decision with its reason, and present a deck of saved views.' },
  { who: 'Curators', what: 'Invite members with roles, set quality thresholds, approve exclusions and keep every revision reproducible.' },
];

/** Signed in: the workspaces. Signed out: one screen on what this is and for whom. */
export default async function Home() {
  if (await getSession()) redirect('/w');
  return (
    <main className="mx-auto flex min-h-screen max-w-6xl flex-col justify-center gap-8 px-6 py-10">
      <header className="flex items-center justify-between gap-4">
        <p className="flex items-center gap-2 text-lg font-semibold tracking-tight">
          {/* eslint-disable-next-line @next/next/no-img-element -- the 32 px mark, an SVG file */}
          <img src="/icon.svg" alt="" width={28} height={28} />
          Lattice Ledger
        </p>
        <nav aria-label="Account" className="flex gap-2">
          <Link href="/sign-in" className={buttonClass('secondary', 'no-underline')}>
            Sign in
          </Link>
          <Link href="/sign-up" className={buttonClass('primary', 'no-underline')}>
            Create an account
          </Link>
        </nav>
      </header>
      <section className="grid items-center gap-8 lg:grid-cols-[minmax(0,1.1fr)_minmax(0,1fr)]">
        <div className="space-y-4">
          <h1 className="text-3xl leading-tight font-semibold tracking-tight text-ink sm:text-4xl">Computed phonons, held against experiment — with their sources.</h1>
          <p className="max-w-xl text-base text-ink-muted">
            A shared notebook for research groups that compute zone-centre phonon frequencies and vibrational entropies. Every value is kept with its citation; computed modes are
            paired with measured peaks by symmetry and frequency; error statistics per method come with their uncertainty; outliers wait for a curator&apos;s decision; and the people
            watching a benchmark get an e-mail when new data move it.
          </p>
          <div className="flex flex-wrap gap-3 pt-1">
            <Link href="/sign-up" className={buttonClass('primary', 'px-4 py-2 text-base no-underline')}>
              Create an account
            </Link>
            <Link href="/sign-in" className={buttonClass('secondary', 'px-4 py-2 text-base no-underline')}>
              Sign in to your workspace
            </Link>
          </div>
        </div>
        <div className="rounded-lg border border-rule bg-panel p-4 text-ink">
          <SpectrumMark />
          <p className="mt-1 text-center text-xs text-ink-faint">Measured peaks above, one method&apos;s computed modes below: the pairs a benchmark is made of.</p>
        </div>
      </section>
      <section aria-label="Who it is for" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {WHO.map((w) => (
          <div key={w.who} className="rounded-lg border border-rule bg-panel px-4 py-3">
            <h2 className="text-sm font-semibold">{w.who}</h2>
            <p className="mt-1 text-sm text-ink-muted">{w.what}</p>
          </div>
        ))}
      </section>
      <p className="text-xs text-ink-faint">
        The statistics depend on the quality and representativeness of the data behind them; they support, and do not replace, expert judgement and peer review.
      </p>
    </main>
  );
}
