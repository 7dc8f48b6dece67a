import { Link } from 'react-router-dom';
import { Card } from '@client/components/ui/card';

const steps = [
  { title: 'Post the block', text: 'Bore, hone, deck: give the numbers you need, the pistons you have, and photos of the block.' },
  { title: 'Compare shops', text: 'Machine shops bid with a price and a turnaround. Ask questions on the job before you choose.' },
  { title: 'Follow the work', text: 'The shop logs each step, from the block arriving to the last pass of the hone.' },
  { title: 'Pay on the numbers', text: 'Your payment is held until you accept the measured inspection record: bore sizes, taper, out-of-round, finish.' },
];

export function LandingRoute() {
  return (
    <div className="flex flex-col gap-10">
      <section className="grid items-center gap-8 md:grid-cols-[3fr_2fr]">
        <div>
          <p className="text-sm font-bold uppercase tracking-widest text-brass-700">Engine machining, measured</p>
          <h1 className="mt-2 text-4xl font-extrabold tracking-tight">Machine work you can check to the tenth before you pay for it.</h1>
          <p className="mt-4 max-w-xl text-lg text-ink-soft">
            Tenthmark connects engine builders with machine shops. Builders post cylinder blocks to bore, hone and deck; shops bid,
            do the work, and prove it with a measured inspection record.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            <Link to="/signup" className="inline-flex min-h-11 items-center rounded-lg bg-slate-700 px-5 font-semibold text-white hover:bg-slate-800">
              Get started
            </Link>
            <Link to="/signin" className="inline-flex min-h-11 items-center rounded-lg px-5 font-semibold text-slate-700 ring-1 ring-slate-300 hover:bg-slate-50">
              Sign in
            </Link>
            <Link to="/calculator" className="inline-flex min-h-11 items-center rounded-lg px-5 font-semibold text-slate-700 underline underline-offset-4 hover:bg-slate-50">
              Try the machining calculator
            </Link>
          </div>
        </div>
        <Card className="bg-slate-800 text-slate-50 ring-0">
          <p className="text-sm font-semibold text-brass-200">A tenth</p>
          <p className="mt-1 text-2xl font-bold">0.0001 in = 2.54 µm</p>
          <p className="mt-3 text-slate-100">
            The smallest step of a good dial bore gauge, and the size of difference that decides whether a bore is round, straight and
            the right size for its piston.
          </p>
        </Card>
      </section>
      <section aria-labelledby="how-heading">
        <h2 id="how-heading" className="text-2xl font-bold">How a job runs</h2>
        <ol className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {steps.map((step, index) => (
            <li key={step.title}>
              <Card className="h-full">
                <p className="text-sm font-bold text-brass-700">Step {index + 1}</p>
                <h3 className="mt-1 text-lg font-bold">{step.title}</h3>
                <p className="mt-2 text-ink-soft">{step.text}</p>
              </Card>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
