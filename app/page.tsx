import Link from 'next/link';
import { Wordmark } from '@/components/ui/logo';
import { SafetyNotice } from '@/components/ui/safety-notice';

const checks = [
  ['Dryer exhaust', 'Developed length with every fitting counted from the adopted edition’s table, transition duct, termination, labels.'],
  ['Make-up air', 'Net free area of the closet openings against the code minimum and the dryer maker’s closet figures.'],
  ['Electrical', 'The 20 A laundry circuit, receptacles within reach, GFCI and AFCI by the adopted NEC edition, 4-wire dryer circuits.'],
  ['Plumbing', 'Standpipe height above the trap weir for your plumbing code, trap size, drain pan where the AHJ wants one.'],
  ['Gas', 'Where a gas dryer may stand, the shut-off within reach, combustion and make-up air.'],
  ['Service and doors', 'Room to pull the appliances out, the rear zone for vent, hoses and cord, and depth behind the doors for hinge arms.'],
];

export default function LandingPage() {
  return (
    <div className="min-h-screen">
      <header className="mx-auto flex max-w-5xl items-center justify-between px-4 py-5">
        <Wordmark />
        <Link href="/sign-in" className="btn-primary">Sign in</Link>
      </header>
      <main id="main" className="mx-auto max-w-5xl px-4 pb-16">
        <section className="py-10 sm:py-16">
          <p className="kicker">For laundry-closet installers and the inspectors who sign them off</p>
          <h1 className="mt-3 max-w-3xl text-3xl font-bold leading-tight sm:text-5xl">
            Know the washer and dryer closet will pass before you build it.
          </h1>
          <p className="mt-5 max-w-2xl text-lg text-ink-soft">
            Renovation contractors, finish carpenters and appliance installers describe the closet they plan: the
            enclosure, the appliances, the exhaust route, openings, receptacles, drain and doors. NookPass checks it
            against the code editions and local amendments your jurisdiction adopted, tells you the smallest change
            that fixes each failure, and produces a report for the inspector that cites every section it checked.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            <Link href="/sign-in" className="btn-primary">Sign in to your company</Link>
            <a href="#what-it-checks" className="btn-secondary">What a check covers</a>
          </div>
        </section>

        <section id="what-it-checks" aria-labelledby="checks-heading" className="py-8">
          <h2 id="checks-heading" className="text-2xl font-bold">What a check covers</h2>
          <ul className="mt-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {checks.map(([title, text]) => (
              <li key={title} className="card p-5">
                <h3 className="font-semibold">{title}</h3>
                <p className="mt-2 text-sm text-ink-soft">{text}</p>
              </li>
            ))}
          </ul>
        </section>

        <section className="grid gap-6 py-8 sm:grid-cols-3" aria-label="Who uses NookPass">
          <div>
            <h2 className="text-lg font-bold">Installers</h2>
            <p className="mt-2 text-sm text-ink-soft">Plan, run a pre-install check, fix what fails, then document the as-built work and send the report.</p>
          </div>
          <div>
            <h2 className="text-lg font-bold">Inspectors</h2>
            <p className="mt-2 text-sm text-ink-soft">Receive reports for your jurisdiction, confirm a paper report is genuine, and record the outcome.</p>
          </div>
          <div>
            <h2 className="text-lg font-bold">Code officials</h2>
            <p className="mt-2 text-sm text-ink-soft">Keep a versioned rule set per jurisdiction: adopted editions, local amendments and thresholds.</p>
          </div>
        </section>

        <SafetyNotice />
      </main>
    </div>
  );
}
