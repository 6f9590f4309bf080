import type { WorklistItem, WorklistSection, WorklistSort } from '@gyre/shared';
import {
  Badge,
  Card,
  Col,
  Flex,
  Pagination,
  Row,
  Segmented,
  Skeleton,
  Tag,
  Typography,
} from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { GYRE_COLORS } from '../../../app/theme';
import { BlindedReviewNotice } from '../../../components/blinded-review-notice';
import { ReadError } from '../../../components/page-states';
import { ResearchCaution } from '../../../components/research-caution';
import { VisitWindowTag } from '../../../components/visit-window-tag';
import { formatAfterFirstUpload, formatDate, formatDateTime } from '../../../lib/format';
import { useWorklist } from '../api/get-worklist';
import '../home.css';

/** Items a section card shows per page. */
export const WORKLIST_PAGE = 8;

const SORT_OPTIONS: { value: WorklistSort; label: string }[] = [
  { value: 'oldest', label: 'Oldest first' },
  { value: 'newest', label: 'Newest first' },
  { value: 'participant', label: 'By participant' },
];

/** Where an item leads: the visit's Review, or Intake with the participant and visit chosen. */
export function linkOf(item: WorklistItem): string {
  if (item.link.screen === 'review' || item.link.participantId === null) {
    return paths.review(item.link.visitId);
  }
  const search = new URLSearchParams({
    participant: item.link.participantId,
    visit: item.link.visitId,
  });
  return `${paths.intake}?${search.toString()}`;
}

function ItemRow({ item }: { item: WorklistItem }) {
  return (
    <li className="gyre-worklist-item">
      <Flex vertical gap={2} className="gyre-shrinkable">
        <Flex wrap gap={8} justify="space-between" align="baseline">
          <Link to={linkOf(item)} className="gyre-worklist-link">
            {item.blindCode !== null
              ? `Visit ${item.blindCode}`
              : `${item.participantCode ?? ''} · ${item.visitLabel}`}
          </Link>
          <ItemSince item={item} />
        </Flex>
        <Flex wrap gap={8} align="baseline">
          {item.schedule !== null ? (
            <VisitWindowTag schedule={item.schedule} />
          ) : (
            <Tag>Blinded</Tag>
          )}
          <Typography.Text className="gyre-worklist-what">{item.what}</Typography.Text>
        </Flex>
      </Flex>
    </li>
  );
}

/**
 * Since when the item waits. Blinded review: the server counts a blinded visit's time from its
 * first upload, and leaves its date out (null).
 */
function ItemSince({ item }: { item: WorklistItem }) {
  if (item.since === null) return null;
  const sinceIsDay = item.since.length === 10;
  return (
    <Typography.Text
      type="secondary"
      className="gyre-figures gyre-caption"
      title={sinceIsDay || item.blindCode !== null ? undefined : formatDateTime(item.since)}
    >
      {item.blindCode !== null
        ? formatAfterFirstUpload(item.since)
        : `${sinceIsDay ? 'visit of' : 'since'} ${formatDate(item.since)}`}
    </Typography.Text>
  );
}

/**
 * One section: its title with the true count, the first page from the whole list, and the
 * next pages asked of the server for this section alone.
 */
function SectionCard({ section, sort }: { section: WorklistSection; sort: WorklistSort }) {
  const [page, setPage] = useState(1);
  const paged = useWorklist(
    { sort, section: section.key, limit: WORKLIST_PAGE, offset: (page - 1) * WORKLIST_PAGE },
    page > 1,
  );
  const shown = page > 1 ? paged.data?.sections[0] : section;
  return (
    <Card
      size="small"
      aria-label={section.title}
      title={
        <Flex gap={8} align="center">
          <span>{section.title}</span>
          <Badge
            count={section.total}
            showZero
            overflowCount={9999}
            style={
              section.total > 0
                ? { backgroundColor: GYRE_COLORS.amberText }
                : { backgroundColor: GYRE_COLORS.line, color: GYRE_COLORS.inkOnLine }
            }
            aria-label={`${section.total} items`}
          />
        </Flex>
      }
      className="gyre-fill-height"
    >
      {section.total === 0 ? (
        <Typography.Text type="secondary">Nothing waits here.</Typography.Text>
      ) : paged.error !== undefined && page > 1 ? (
        <ReadError read={paged} title="This page could not be loaded" />
      ) : shown === undefined ? (
        <Skeleton active paragraph={{ rows: 3 }} />
      ) : (
        <>
          <ul className="gyre-bare-list">
            {shown.items.map((item) => (
              <ItemRow key={item.key} item={item} />
            ))}
          </ul>
          {section.total > WORKLIST_PAGE && (
            <Pagination
              size="small"
              simple
              align="end"
              current={page}
              pageSize={WORKLIST_PAGE}
              total={shown.total}
              onChange={setPage}
              className="gyre-above-xs"
            />
          )}
        </>
      )}
    </Card>
  );
}

/**
 * The worklist on the home screen: analysts see what waits for review, decision and signature
 * in the study; monitors the same list to follow it; technicians their site's uploads that
 * need attention. Each item links to the screen where it is dealt with.
 */
export function Worklist() {
  const [sort, setSort] = useState<WorklistSort>('oldest');
  const list = useWorklist({ sort, limit: WORKLIST_PAGE });
  if (list.error !== undefined) {
    return <ReadError read={list} title="The worklist could not be loaded" />;
  }
  const data = list.data;
  const waiting = data?.sections.reduce((sum, s) => sum + s.total, 0) ?? 0;
  const blinded = data?.sections.some((s) => s.items.some((i) => i.blindCode !== null)) ?? false;
  return (
    <section aria-label="Worklist">
      {data?.kind === 'review' && <ResearchCaution />}
      <Flex wrap gap={12} justify="space-between" align="center" className="gyre-below-sm">
        <Typography.Title level={3} className="gyre-flush">
          {data?.kind === 'uploads' ? 'Uploads that need attention' : 'Worklist'}
        </Typography.Title>
        <Segmented<WorklistSort>
          aria-label="Order"
          options={SORT_OPTIONS}
          value={sort}
          onChange={setSort}
        />
      </Flex>
      {data === undefined ? (
        <Skeleton active paragraph={{ rows: 6 }} />
      ) : (
        <>
          <Typography.Paragraph type="secondary">
            {waiting === 0
              ? 'Nothing is waiting.'
              : data.kind === 'uploads'
                ? "Your site's uploads that were refused, carry warnings, failed to compute, and visits still missing a recording."
                : data.readOnly
                  ? 'What waits for the analysts in the study. You follow it here; marking visits reviewed is for analysts.'
                  : 'What waits for you in the study. Open an item to review it.'}
          </Typography.Paragraph>
          {blinded && (
            <BlindedReviewNotice description="Visits you have not decided on show their code only: no date, planned visit, group or participant. Record a flag or “no flag” with a reason in Review to see them." />
          )}
          <Row gutter={[16, 16]}>
            {data.sections.map((section) => (
              <Col key={section.key} xs={24} lg={12}>
                <SectionCard key={`${section.key}-${sort}`} section={section} sort={data.sort} />
              </Col>
            ))}
          </Row>
        </>
      )}
    </section>
  );
}
