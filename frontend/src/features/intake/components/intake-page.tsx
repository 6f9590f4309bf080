import { Button, Card, Col, Form, Row, Select, Space } from 'antd';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/page-header';
import { ErrorState, LoadingState } from '../../../components/page-states';
import { formatDate } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useParticipants } from '../api/participants';
import { useVisits } from '../api/visits';
import { NewParticipantForm } from './new-participant-form';
import { NewVisitForm } from './new-visit-form';
import { RecordingDropzone } from './recording-dropzone';
import { RecordingsTable } from './recordings-table';

/**
 * Intake (technician): pick participant and visit, drop the visit's files, follow each
 * recording from upload through the checks to the end of its computation.
 */
export function IntakePage() {
  const { me } = useSession();
  const ability = useAppAbility();
  const [search, setSearch] = useSearchParams();
  const participantId = search.get('participant');
  const visitId = search.get('visit');
  const participants = useParticipants();
  // An id from an old or edited address that is not in the list is not asked about.
  const knownParticipantId =
    participants.data?.items.some((p) => p.id === participantId) === true ? participantId : null;
  const visits = useVisits(knownParticipantId);
  const [visitFormOpen, setVisitFormOpen] = useState(false);
  const [participantFormOpen, setParticipantFormOpen] = useState(false);

  const choose = (next: { participant?: string | null; visit?: string | null }) => {
    const params = new URLSearchParams(search);
    for (const [name, value] of Object.entries(next)) {
      if (value === null || value === undefined) params.delete(name);
      else params.set(name, value);
    }
    setSearch(params, { replace: true });
  };

  if (participants.error !== undefined) {
    return (
      <>
        <PageHeader title="Intake" />
        <ErrorState
          error={participants.error}
          onRetry={() => void participants.mutate()}
          title="The participants could not be loaded"
        />
      </>
    );
  }
  if (participants.data === undefined) {
    return (
      <>
        <PageHeader title="Intake" />
        <LoadingState label="Loading participants" />
      </>
    );
  }

  const participant = participants.data.items.find((p) => p.id === participantId) ?? null;
  const visitList = visits.data?.items ?? [];
  const visit = visitList.find((v) => v.id === visitId) ?? null;
  const canAddParticipant = ability.can('create', 'Participant') && me.site !== null;

  return (
    <>
      <PageHeader
        title="Intake"
        description="Register a visit, upload its resting and task recordings, and follow their checks."
      />
      <Space orientation="vertical" size={16} style={{ width: '100%' }}>
        <Card title="Participant and visit">
          <Form layout="vertical" component="div">
            <Row gutter={24}>
              <Col xs={24} md={12}>
                <Form.Item
                  label="Participant"
                  htmlFor="intake-participant"
                  style={{ marginBottom: 8 }}
                >
                  <Select
                    id="intake-participant"
                    showSearch={{ optionFilterProp: 'label' }}
                    placeholder={
                      participants.data.items.length === 0
                        ? 'No participants yet: register one'
                        : 'Choose or type a participant code'
                    }
                    value={participant?.id}
                    onChange={(id: string) => choose({ participant: id, visit: null })}
                    options={participants.data.items.map((p) => ({ value: p.id, label: p.code }))}
                    style={{ width: '100%' }}
                  />
                </Form.Item>
                {canAddParticipant && (
                  <Button
                    type="link"
                    style={{ paddingInline: 0 }}
                    onClick={() => setParticipantFormOpen(true)}
                  >
                    Register a new participant
                  </Button>
                )}
              </Col>
              <Col xs={24} md={12}>
                <Form.Item label="Visit" htmlFor="intake-visit" style={{ marginBottom: 8 }}>
                  <Select
                    id="intake-visit"
                    disabled={participant === null}
                    loading={visits.isLoading}
                    placeholder={
                      participant === null
                        ? 'Choose a participant first'
                        : visitList.length === 0
                          ? 'No visits yet: register one'
                          : 'Choose a visit'
                    }
                    value={visit?.id}
                    onChange={(id: string) => choose({ visit: id })}
                    options={visitList.map((v) => ({
                      value: v.id,
                      label: `${v.label} · ${formatDate(v.visitDate)}`,
                    }))}
                    style={{ width: '100%' }}
                  />
                </Form.Item>
                {participant !== null && (
                  <Button
                    type="link"
                    style={{ paddingInline: 0 }}
                    onClick={() => setVisitFormOpen(true)}
                  >
                    Register a new visit
                  </Button>
                )}
              </Col>
            </Row>
          </Form>
          {visits.error !== undefined && (
            <ErrorState
              error={visits.error}
              onRetry={() => void visits.mutate()}
              title="The visits could not be loaded"
            />
          )}
        </Card>
        {participant !== null && visit !== null && (
          <>
            <RecordingDropzone
              visitId={visit.id}
              visitName={`${participant.code}, ${visit.label}`}
            />
            <RecordingsTable visitId={visit.id} />
          </>
        )}
      </Space>
      {participant !== null && (
        <NewVisitForm
          open={visitFormOpen}
          participantId={participant.id}
          participantCode={participant.code}
          existingLabels={visitList.map((v) => v.label)}
          onClose={() => setVisitFormOpen(false)}
          onCreated={(created) => {
            setVisitFormOpen(false);
            choose({ visit: created.id });
          }}
        />
      )}
      {canAddParticipant && me.site !== null && (
        <NewParticipantForm
          open={participantFormOpen}
          siteId={me.site.id}
          siteName={me.site.name}
          onClose={() => setParticipantFormOpen(false)}
          onCreated={(created) => {
            setParticipantFormOpen(false);
            choose({ participant: created.id, visit: null });
          }}
        />
      )}
    </>
  );
}
