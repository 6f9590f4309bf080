import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { PageHeader } from '../../../components/page-header';
import { ResearchCaution } from '../../../components/research-caution';
import { SignedReports } from './signed-reports';

/**
 * Signed reports, revision by revision (the coordinator's e-mail links here): every signed
 * revision of the user's scope with its PDF, earlier ones kept beside newer ones.
 */
export function SignedReportsPage() {
  return (
    <>
      <ResearchCaution />
      <PageHeader
        title="Signed report revisions"
        description={
          <>
            Every signed revision, newest first; a revision never changes once signed.{' '}
            <Link to={paths.reports}>All reports</Link>
          </>
        }
      />
      <SignedReports />
    </>
  );
}
