/**
 * Pages of the certificate workflow (issue 6): review queue and review of one job (signatory),
 * issued certificates (signatory, quality manager), the customer's certificates, the e-mail log
 * and the local mailbox. They compose the review, certificates, portal and mail features; the review
 * of one job is ./review-job-page, loaded on its own.
 */
import { NavLink } from 'react-router';
import { useMe } from '../../features/session/api/get-me';
import { ReviewQueue } from '../../features/review/components/review-queue';
import { CertificateList } from '../../features/certificates/components/certificate-list';
import { MyCertificates } from '../../features/portal/components/my-certificates';
import { Mailbox, MailLog } from '../../features/mail/components/mail-log';
import { Cautions } from '../../components/ui/cautions';
import { canOpen, SECTIONS, type SectionId } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';
import type { ReactNode } from 'react';

function Guarded({ id, title, intro, children }: { id: SectionId; title?: string; intro?: ReactNode; children: ReactNode }) {
  const { user } = useMe();
  const section = SECTIONS[id];
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${title ?? section.label} · Emberline`}</title>
      <PageHeader title={title ?? section.label}>{intro}</PageHeader>
      {children}
    </>
  );
}

export function ReviewSectionPage() {
  return (
    <Guarded id="review" intro="Jobs the analysts have submitted. Open one to read everything its certificate will say, the budgets and the checks; approve it with your password, or send it back with a comment.">
      <ReviewQueue />
    </Guarded>
  );
}

export function CertificatesSectionPage() {
  const { user } = useMe();
  return (
    <Guarded id="certificates" intro="Every certificate issued, newest first, with its status. A current certificate is changed only by an amendment: a new certificate that names it and says why (ISO/IEC 17025 §7.8.8).">
      <div className="space-y-6">
        <CertificateList canAmend={user.role === 'signatory' || user.role === 'quality_manager'} />
        <Cautions />
      </div>
    </Guarded>
  );
}

export function MyCertificatesPage() {
  return (
    <Guarded id="my-certificates" intro="Your organisation’s calibration certificates. Each PDF is the signed file as issued; a superseded certificate has been replaced by a newer one.">
      <MyCertificates />
    </Guarded>
  );
}

const tab = ({ isActive }: { isActive: boolean }) => `border-b-2 px-3 py-2 text-sm font-semibold ${isActive ? 'border-ember text-ink' : 'border-transparent text-ink-muted'}`;

function MailTabs() {
  const { user } = useMe();
  if (user.role !== 'admin') return null;
  return (
    <nav aria-label="E-mail views" className="mb-4 flex gap-2 border-b border-line">
      <NavLink end to="/app/mail" className={tab}>
        Delivery log
      </NavLink>
      <NavLink to="/app/mail/mailbox" className={tab}>
        Local mailbox
      </NavLink>
    </nav>
  );
}

export function MailSectionPage() {
  const { user } = useMe();
  return (
    <Guarded id="mail" intro="Every e-mail Emberline sends, such as certificates to customer contacts: delivery status, attempts and the last error. Failed deliveries are retried with increasing delays.">
      <MailTabs />
      {user.role === 'quality_manager' && (
        <p className="mb-4 text-sm">
          <NavLink className="text-ember-strong underline" to="/app/certificates">
            Issued certificates and amendments
          </NavLink>
        </p>
      )}
      <MailLog />
    </Guarded>
  );
}

export function MailboxPage() {
  const { user } = useMe();
  if (user.role !== 'admin') return <ForbiddenPage what="Local mailbox" />;
  return (
    <Guarded id="mail" title="Local mailbox" intro="What the built-in test mail server received, with attachments. It stands in for a real mail server while SMTP_HOST is not set; nothing leaves this machine.">
      <MailTabs />
      <Mailbox />
    </Guarded>
  );
}
