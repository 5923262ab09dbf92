import { Link } from 'react-router';
import { buttonClasses } from '../../components/ui/button';
import { Cautions } from '../../components/ui/cautions';

const STEPS = [
  {
    title: 'Measurement models',
    body: 'The quality manager writes each model once: the measurand, its equations (Planck’s law, Sakuma–Hattori interpolation and other radiometric functions are built in), the input quantities and their usual distributions. A model is validated against a stored reference case before it is released, and is frozen from then on.',
  },
  {
    title: 'Uncertainty budgets',
    body: 'For every calibration point the analyst enters readings and Type B contributions. The budget follows the GUM (JCGM 100): standard uncertainties, sensitivity coefficients, effective degrees of freedom and the coverage factor. A Monte Carlo propagation (JCGM 101) checks the result for non-linear models.',
  },
  {
    title: 'Review and approval',
    body: 'The finished job goes to an authorised signatory, who approves it by entering their password again, or returns it with comments. Reference standards past their calibration date and results outside the CMC are flagged before anyone approves.',
  },
  {
    title: 'Signed certificates',
    body: 'Approval issues a PDF calibration certificate with the items ISO/IEC 17025 §7.8 requires and the uncertainty budget as an annex, digitally signed and recorded with its SHA-256 fingerprint. The customer receives it by e-mail and finds it in their own account.',
  },
  {
    title: 'Public check',
    body: 'Anyone holding a certificate can confirm on this site that it was issued by the laboratory and has not been altered or replaced.',
  },
];

export function LandingPage() {
  return (
    <>
      <title>Emberline: uncertainty and calibration certificates for radiometry laboratories</title>
      <section className="border-b border-line bg-surface">
        <div className="mx-auto max-w-5xl px-6 py-14">
          <p className="text-sm font-semibold uppercase tracking-wider text-ember-strong">For radiometry and radiation-thermometry laboratories</p>
          <h1 className="mt-3 max-w-3xl text-3xl font-semibold text-ink">
            From readings to a signed calibration certificate, with the uncertainty evaluated the way the GUM asks.
          </h1>
          <p className="mt-4 max-w-2xl text-lg text-ink-muted">
            Emberline supports ISO/IEC 17025 laboratories that calibrate infrared thermometers, thermal imagers,
            blackbody sources, transfer radiation thermometers and spectral radiance sources. It keeps the models,
            budgets, reviews and certificates of each job together, and records who did what.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            <Link to="/sign-in" className={buttonClasses('primary', 'no-underline')}>
              Sign in
            </Link>
            <Link to="/verify" className={buttonClasses('secondary', 'no-underline')}>
              Check a certificate
            </Link>
          </div>
        </div>
      </section>
      <section aria-labelledby="how-heading" className="mx-auto max-w-5xl px-6 py-12">
        <h2 id="how-heading" className="text-xl font-semibold">How a job goes through Emberline</h2>
        <ol className="mt-6 grid gap-4 md:grid-cols-2">
          {STEPS.map((step, i) => (
            <li key={step.title} className="rounded-card border border-line bg-surface p-5 shadow-card">
              <h3 className="flex items-baseline gap-3 text-base font-semibold">
                <span className="font-mono text-sm text-ember-strong" aria-hidden="true">
                  {String(i + 1).padStart(2, '0')}
                </span>
                {step.title}
              </h3>
              <p className="mt-2 text-sm text-ink-muted">{step.body}</p>
            </li>
          ))}
        </ol>
      </section>
      <div className="mx-auto max-w-5xl px-6 pb-14">
        <Cautions />
      </div>
    </>
  );
}
