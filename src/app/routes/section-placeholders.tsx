/**
 * The first page of each section while its feature is not built: the section's heading, what it
 * is for, and an empty state saying what it will list. A feature replaces its entry in
 * app/router.tsx with its own page.
 */
import type { ReactNode } from 'react';
import { EmptyState } from '../../components/ui/empty-state';
import type { SectionId } from '../navigation';

interface Placeholder {
  intro: string;
  emptyTitle: string;
  empty: ReactNode;
}

export const PLACEHOLDERS: Record<SectionId, Placeholder> = {
  users: {
    intro: 'Everyone who signs in to this laboratory’s Emberline, with their role. Only administrators create accounts; nobody can choose their own role.',
    emptyTitle: 'No accounts listed',
    empty: <p>Each account will show its name, e-mail address, role and, for customer accounts, the customer organisation it belongs to.</p>,
  },
  lab: {
    intro: 'The laboratory’s name, address and accreditation number as they are printed on every certificate, and the key certificates are signed with.',
    emptyTitle: 'Signing key',
    empty: <p>The key that signs certificates is not listed on this page. Its holder, validity dates and fingerprint belong here, next to the details above.</p>,
  },
  mail: {
    intro: 'Every e-mail Emberline has sent, such as certificates to customer contacts, with its recipients and delivery result.',
    emptyTitle: 'No e-mail sent',
    empty: <p>Once a certificate is issued, the message to the customer’s contacts is listed here with its time, recipients, subject and attachment.</p>,
  },
  audit: {
    intro: 'The record of every creation, change, approval, issue, e-mail and download, in order. Entries are chained so that a removed or altered entry shows.',
    emptyTitle: 'No entries to show',
    empty: <p>Each entry will give the time, the person, the action and the record it concerns.</p>,
  },
  templates: {
    intro: 'Each measurement model sets out the measurand, the model equations, the input quantities with their default distributions, CMC rows and the certificate wording. A model is drafted, validated, released (and then frozen) and finally retired.',
    emptyTitle: 'No measurement models listed',
    empty: <p>Each model will show its name, version, state (draft, released or retired) and the date it was released.</p>,
  },
  standards: {
    intro: 'The laboratory’s reference standards: blackbody sources, reference thermometers and radiometers, with their certificate values, expanded uncertainties and next calibration dates.',
    emptyTitle: 'No reference standards listed',
    empty: <p>Each standard will show its identifier, description, the value and uncertainty from its own certificate, and the date by which it must be recalibrated, with overdue ones marked in words.</p>,
  },
  customers: {
    intro: 'The organisations the laboratory calibrates for, their contacts (who receive certificates by e-mail) and their instruments.',
    emptyTitle: 'No customers listed',
    empty: <p>Each customer will show its name, address, contacts and the instruments it has sent for calibration.</p>,
  },
  jobs: {
    intro: 'A calibration job covers one customer’s item: its measurement model, dates, environment and calibration points, each with its uncertainty budget.',
    emptyTitle: 'No calibration jobs listed',
    empty: <p>Each job will show its customer, item, model version, number of calibration points and stage: draft, submitted for review, returned, approved or issued.</p>,
  },
  review: {
    intro: 'Jobs that analysts have submitted. Review each budget and result, then approve it (you will be asked for your password) or return it with comments.',
    emptyTitle: 'Nothing awaiting review',
    empty: <p>Submitted jobs will be listed here, oldest first, with the customer, item, analyst and submission date.</p>,
  },
  certificates: {
    intro: 'Calibration certificates issued by this laboratory, each signed and recorded with its SHA-256 fingerprint. An amendment is issued as a new certificate that replaces the earlier one.',
    emptyTitle: 'No certificates listed',
    empty: <p>Each certificate will show its number, customer, item, issue date, the signatory who approved it and whether it has been replaced.</p>,
  },
  'my-certificates': {
    intro: 'The calibration certificates the laboratory has issued to your organisation. Only your organisation’s certificates are shown.',
    emptyTitle: 'No certificates listed',
    empty: <p>Each certificate will show its number, the instrument, the calibration date and a link to download the signed PDF.</p>,
  },
};

export function SectionEmptyState({ id }: { id: SectionId }) {
  const p = PLACEHOLDERS[id];
  return <EmptyState title={p.emptyTitle}>{p.empty}</EmptyState>;
}
