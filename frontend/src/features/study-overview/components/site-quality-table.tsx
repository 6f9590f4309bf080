import type { SiteQuality } from '@gyre/shared';
import { Table, Typography } from 'antd';
import { ScrollRegion } from '../../../components/scroll-region';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';

const share = (v: number | null) => formatShareAsPercent(v);
const ratio = (v: number | null) => formatNumber(v, 2);

/** Per site: rejection rate and the quality figures of its current runs, for monitors. */
export function SiteQualityTable({ sites }: { sites: SiteQuality[] }) {
  return (
    <>
      <ScrollRegion label="Site quality table">
        <Table<SiteQuality>
          aria-label="Site quality"
          rowKey="siteId"
          size="small"
          pagination={false}
          tableLayout="auto"
          className="gyre-table-natural-width"
          dataSource={sites}
          locale={{ emptyText: 'No site to compare yet.' }}
          columns={[
            { key: 'site', title: 'Site', render: (_, s) => s.siteName },
            {
              key: 'rejection',
              title: 'Rejected uploads',
              render: (_, s) => (
                <span className="gyre-figures">
                  {share(s.rejectionRate)} ({s.rejected} of {s.uploads})
                </span>
              ),
            },
            {
              key: 'epochs',
              title: 'Epochs dropped',
              render: (_, s) => <span className="gyre-figures">{share(s.epochsDroppedShare)}</span>,
            },
            {
              key: 'line',
              title: 'Line noise 50 / 60 Hz',
              render: (_, s) => (
                <span className="gyre-figures">
                  {ratio(s.lineNoiseRatio50Hz)} / {ratio(s.lineNoiseRatio60Hz)}
                </span>
              ),
            },
            {
              key: 'slips',
              title: 'Phase slips',
              render: (_, s) => <span className="gyre-figures">{share(s.phaseSlipShare)}</span>,
            },
            {
              key: 'roi',
              title: 'ROI channels lost',
              render: (_, s) => (
                <span className="gyre-figures">
                  {s.roiChannelsLost === null
                    ? '—'
                    : `${formatNumber(s.roiChannelsLost, 1)} per run`}
                  {s.runsWithoutRoi > 0 && ` · ${s.runsWithoutRoi} without any`}
                </span>
              ),
            },
            {
              key: 'runs',
              title: 'Runs',
              render: (_, s) => <span className="gyre-figures">{s.runs}</span>,
            },
          ]}
        />
      </ScrollRegion>
      <Typography.Paragraph type="secondary" style={{ fontSize: 13, marginTop: 12 }}>
        Rejected uploads: files refused at upload among every file uploaded at the site (replaced
        ones included). Over the current runs (docs/method.md, quality checks): epochs dropped is
        the mean share of task onsets whose trial was left out; line noise the mean of each
        run&apos;s median over channels of the power within ±1 Hz of 50 or 60 Hz over the power 2–6
        Hz away (about 1 means none); phase slips the mean share of instantaneous-frequency values
        outside the band in the region of interest (task); ROI channels lost the mean number of
        region-of-interest channels wanted but not used, for any reason.
      </Typography.Paragraph>
    </>
  );
}
