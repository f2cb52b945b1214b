import Link from 'next/link';
import { Wordmark } from '@/components/brand/logo';
import { ButtonLink } from '@/components/ui/button';
import { currentUser } from '@/lib/current-user';

export default async function LandingPage() {
  const user = await currentUser();
  return (
    <main className="mx-auto flex min-h-dvh max-w-5xl flex-col px-5 py-6">
      <header className="flex items-center justify-between">
        <Wordmark />
        <nav className="flex gap-2">
          {user ? (
            <ButtonLink href="/railways">Open my railways</ButtonLink>
          ) : (
            <>
              <ButtonLink href="/sign-in" variant="ghost">
                Sign in
              </ButtonLink>
              <ButtonLink href="/sign-up">Create an account</ButtonLink>
            </>
          )}
        </nav>
      </header>
      <section className="grid flex-1 items-center gap-10 py-12 md:grid-cols-[1.2fr_1fr]">
        <div>
          <p className="mb-3 text-sm font-semibold uppercase tracking-widest text-brass">Operating sessions, planned</p>
          <h1 className="font-display text-4xl font-bold leading-tight sm:text-5xl">
            A timetable your blocks, cabs and power supplies can actually keep.
          </h1>
          <p className="mt-5 max-w-xl text-lg text-muted">
            Fishplate checks every run of an operating session against your layout&apos;s blocks, cabs, motor
            drivers and supplies, and repairs the timing with one click. Then it invites your crew with calendar
            e-mails and shows each operator when they run, which cab they hold and which train they drive.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            <ButtonLink href={user ? '/railways' : '/sign-up'}>{user ? 'Go to my railways' : 'Start planning'}</ButtonLink>
            <ButtonLink href="/sign-in" variant="secondary">
              Try the demo railway
            </ButtonLink>
          </div>
        </div>
        <TrainGraphSketch />
      </section>
      <footer className="border-t border-line pt-4 text-sm text-muted">
        Fishplate&apos;s figures are planning aids, not a substitute for manufacturers&apos; ratings, local electrical
        codes or a licensed electrician. <Link className="underline" href="/sign-in">Sign in</Link>
      </footer>
    </main>
  );
}

/** A small decorative time–distance diagram: three trains, one clash circled. */
function TrainGraphSketch() {
  return (
    <svg viewBox="0 0 320 220" className="w-full rounded-plate border border-line bg-surface" aria-hidden>
      {[40, 80, 120, 160].map((y) => (
        <line key={y} x1="30" x2="310" y1={y} y2={y} stroke="var(--line)" strokeDasharray="3 4" />
      ))}
      {['Yard', 'Loop', 'Main', 'Terminus'].map((label, i) => (
        <text key={label} x="4" y={44 + i * 40} fontSize="9" fill="var(--muted)">
          {label}
        </text>
      ))}
      <polyline points="40,40 90,40 150,120 190,120 240,160" fill="none" stroke="var(--verdigris)" strokeWidth="3" />
      <polyline points="70,160 130,160 170,80 220,80 280,40" fill="none" stroke="var(--brass)" strokeWidth="3" />
      <polyline points="110,40 160,40 230,160 300,160" fill="none" stroke="var(--ink)" strokeWidth="2" strokeDasharray="6 3" />
      <circle cx="206" cy="125" r="13" fill="none" stroke="var(--signal)" strokeWidth="2.5" />
      <text x="222" y="112" fontSize="10" fill="var(--signal)" fontWeight="700">
        clash
      </text>
    </svg>
  );
}
