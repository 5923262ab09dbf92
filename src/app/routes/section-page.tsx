import { useMe } from '../../features/session/api/get-me';
import { canOpen, isViewOnly, SECTIONS, type SectionId } from '../navigation';
import { PLACEHOLDERS, SectionEmptyState } from './section-placeholders';
import { LabDetails } from './lab-details';
import { PageHeader } from './page-header';
import { ForbiddenPage } from './forbidden';

/** A section of /app, checked against the signed-in role. */
export function SectionPage({ id }: { id: SectionId }) {
  const { user, lab } = useMe();
  const section = SECTIONS[id];
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label} viewOnly={isViewOnly(section, user.role)}>
        {PLACEHOLDERS[id].intro}
      </PageHeader>
      {id === 'lab' && <LabDetails lab={lab} />}
      <SectionEmptyState id={id} />
    </>
  );
}

/** /app/lab: the laboratory's details (a route component takes no props). */
export function LabSectionPage() {
  return <SectionPage id="lab" />;
}
