import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';

const STEPS = [
  {
    title: 'Describe the wheel and frame',
    body: 'Rim width and diameter, spoke count and gauge, hub and brake, and the spacing of your frame. We check the fit as you type.',
  },
  {
    title: 'Builders bid',
    body: 'Independent shops send a price and a lead time. Compare them against a fair baseline cost before you choose.',
  },
  {
    title: 'Pay into escrow, ride',
    body: 'Your money is held until the wheel arrives and you confirm it. Then the builder is paid, and you both rate the job.',
  },
];

export default function HomePage() {
  return (
    <div className="space-y-12">
      <section className="grid items-center gap-8 md:grid-cols-[3fr_2fr]">
        <div>
          <p className="text-sm font-semibold uppercase tracking-widest text-brass-700">Wide wheels, laced to fit</p>
          <h1 className="mt-2 text-4xl font-extrabold text-ink-900">
            Three, four and five inch rims. Seventy-two spokes or a hundred and forty-four. Built by someone who has done it before.
          </h1>
          <p className="mt-4 max-w-xl text-lg text-ink-500">
            Lacewright checks that the hub, cog, chainline and bottom bracket suit the rim and the frame, works out spoke lengths and a fair
            price, and puts your build in front of wheel builders who bid for it.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            <ButtonLink href="/fit">Check a fit</ButtonLink>
            <ButtonLink href="/join" tone="secondary">
              Join as a rider or a builder
            </ButtonLink>
          </div>
        </div>
        <HeroWheel />
      </section>
      <section aria-labelledby="how">
        <h2 id="how" className="mb-4 text-2xl font-bold">
          How a build goes
        </h2>
        <ol className="grid gap-4 md:grid-cols-3">
          {STEPS.map((step, i) => (
            <li key={step.title}>
              <Card className="h-full">
                <p className="font-display text-3xl font-extrabold text-brass-500">{i + 1}</p>
                <h3 className="mt-1 text-lg font-bold">{step.title}</h3>
                <p className="mt-2 text-sm text-ink-500">{step.body}</p>
              </Card>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}

/** A decorative many-spoke wheel, drawn rather than photographed. */
function HeroWheel() {
  const spokes = 36;
  const lines = Array.from({ length: spokes }, (_, i) => {
    const hubAngle = (i / spokes) * 2 * Math.PI;
    const rimAngle = hubAngle + (i % 2 ? 1 : -1) * ((3 * 4 * Math.PI) / spokes);
    return {
      x1: 100 + 14 * Math.cos(hubAngle),
      y1: 100 + 14 * Math.sin(hubAngle),
      x2: 100 + 84 * Math.cos(rimAngle),
      y2: 100 + 84 * Math.sin(rimAngle),
    };
  });
  return (
    <svg viewBox="0 0 200 200" className="mx-auto w-full max-w-xs" role="img" aria-label="A drawing of a spoked wheel">
      <circle cx="100" cy="100" r="94" fill="none" stroke="#1b2230" strokeWidth="12" />
      <circle cx="100" cy="100" r="86" fill="none" stroke="#b98a2e" strokeWidth="4" />
      <g stroke="#17716f" strokeWidth="0.9">
        {lines.map((l, i) => (
          <line key={i} x1={l.x1.toFixed(2)} y1={l.y1.toFixed(2)} x2={l.x2.toFixed(2)} y2={l.y2.toFixed(2)} />
        ))}
      </g>
      <circle cx="100" cy="100" r="15" fill="#0f5d5c" />
      <circle cx="100" cy="100" r="5" fill="#e6c27a" />
    </svg>
  );
}
