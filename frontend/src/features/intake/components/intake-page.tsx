import { subject } from '@gyre/shared';
import { Button, Card, Col, Form, Row, Select, Space, Typography } from 'antd';
import dayjs from 'dayjs';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/page-header';
import { ErrorState, LoadingState } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import {
  studyDayText,
  visitWindowText,
  VisitWindowTag,
} from '../../../components/visit-window-tag';
import { formatDate } from '../../../lib/format';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useDue } from '../api/due';
import { useParticipants } from '../api/participants';
import { useGroups, usePlannedVisits } from '../../../lib/study-schedule';
import { useVisits } from '../api/visits';
import { BidsImportPanel } from './bids-import-panel';
import { BulkUploadPanel } from './bulk-upload-panel';
import { DueCard } from './due-card';
import { NewParticipantForm } from './new-participant-form';
import { NewVisitForm } from './new-visit-form';
import { ParticipantDetailsForm } from './participant-details-form';
import { VisitIntake } from './visit-intake';

/**
 * Intake (technician): what is due at the site, then pick participant and visit, drop the
 * visit's files, follow each recording from upload through the checks to the end of its
 * computation.
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
  const [detailsFormOpen, setDetailsFormOpen] = useState(false);
  const studyId = me.study?.id ?? null;
  const schedule = usePlannedVisits(studyId);
  const groups = useGroups(studyId);
  // The technician's own calendar day decides what is due "today".
  const due = useDue(studyId, dayjs().format('YYYY-MM-DD'));

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
  const canEditParticipant =
    participant !== null && ability.can('update', subject('Participant', participant));
  const groupName = (id: string | null) =>
    id === null ? 'no group' : (groups.data?.find((g) => g.id === id)?.name ?? '…');

  return (
    <>
      <PageHeader
        title="Intake"
        description="Register a visit, upload its resting and task recordings, and follow their checks."
      />
      <Space orientation="vertical" size={16} className="gyre-fill-width">
        {/* Intake shows computed states and quality warnings: research use, not diagnosis. */}
        <ResearchCaution />
        {studyId !== null && (
          <DueCard
            due={due.data}
            error={due.error}
            onRetry={() => void due.mutate()}
            onChoose={(id) => choose({ participant: id, visit: null })}
          />
        )}
        <Card title="Participant and visit">
          <Form layout="vertical" component="div">
            <Row gutter={24}>
              <Col xs={24} md={12}>
                <Form.Item
                  label="Participant"
                  htmlFor="intake-participant"
                  className="gyre-below-xs"
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
                    className="gyre-fill-width"
                  />
                </Form.Item>
                {participant !== null && (
                  <Typography.Paragraph
                    type="secondary"
                    aria-label="Enrolment and group"
                    style={{ margin: '0 0 4px' }}
                  >
                    {participant.enrolmentDate === null
                      ? 'No enrolment date yet'
                      : `Enrolled ${formatDate(participant.enrolmentDate)}`}
                    {' · '}
                    {groupName(participant.groupId)}
                  </Typography.Paragraph>
                )}
                <Space wrap size={16}>
                  {canAddParticipant && (
                    <Button
                      type="link"
                      className="gyre-inline-link"
                      onClick={() => setParticipantFormOpen(true)}
                    >
                      Register a new participant
                    </Button>
                  )}
                  {canEditParticipant && (
                    <Button
                      type="link"
                      className="gyre-inline-link"
                      onClick={() => setDetailsFormOpen(true)}
                    >
                      Change enrolment date or group
                    </Button>
                  )}
                </Space>
              </Col>
              <Col xs={24} md={12}>
                <Form.Item label="Visit" htmlFor="intake-visit" className="gyre-below-xs">
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
                      label:
                        v.schedule.window === 'early' || v.schedule.window === 'late'
                          ? `${v.label} · ${formatDate(v.visitDate)} · ${visitWindowText(v.schedule)}`
                          : `${v.label} · ${formatDate(v.visitDate)}`,
                    }))}
                    className="gyre-fill-width"
                  />
                </Form.Item>
                {visit !== null && (
                  <Space
                    wrap
                    size={8}
                    style={{ display: 'flex', marginBottom: 4 }}
                    aria-label="Visit schedule"
                  >
                    <VisitWindowTag schedule={visit.schedule} />
                    <Typography.Text type="secondary">
                      {studyDayText(visit.schedule)}
                    </Typography.Text>
                  </Space>
                )}
                {participant !== null && (
                  <Button
                    type="link"
                    className="gyre-inline-link"
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
          <VisitIntake
            key={visit.id}
            visitId={visit.id}
            visitName={`${participant.code}, ${visit.label}`}
          />
        )}
        {studyId !== null && ability.can('upload', 'Recording') && (
          <BulkUploadPanel studyId={studyId} />
        )}
        {studyId !== null && ability.can('upload', 'Recording') && (
          <BidsImportPanel studyId={studyId} />
        )}
      </Space>
      {participant !== null && (
        <NewVisitForm
          open={visitFormOpen}
          participantId={participant.id}
          participantCode={participant.code}
          enrolmentDate={participant.enrolmentDate}
          schedule={schedule.data ?? []}
          visits={visitList}
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
          groups={groups.data ?? []}
          onClose={() => setParticipantFormOpen(false)}
          onCreated={(created) => {
            setParticipantFormOpen(false);
            choose({ participant: created.id, visit: null });
          }}
        />
      )}
      {participant !== null && canEditParticipant && (
        <ParticipantDetailsForm
          open={detailsFormOpen}
          participant={participant}
          groups={groups.data ?? []}
          onClose={() => setDetailsFormOpen(false)}
          onSaved={() => setDetailsFormOpen(false)}
        />
      )}
    </>
  );
}
