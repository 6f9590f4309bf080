import { Typography } from 'antd';
import { GyreMark } from '../../../components/gyre-mark';
import { ResearchCaution } from '../../../components/research-caution';
import { GYRE_COLORS } from '../../../app/theme';

/** The frame of every screen before sign-in: mark, name, one card, the caution. */
export function AuthLayout({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <main
      style={{
        minHeight: '100vh',
        display: 'grid',
        // One column of at most 420 px that may shrink: a phone never scrolls sideways.
        gridTemplateColumns: 'minmax(0, 420px)',
        justifyContent: 'center',
        alignContent: 'center',
        padding: '24px 16px',
        background: `linear-gradient(160deg, ${GYRE_COLORS.mist} 0%, ${GYRE_COLORS.mistDeep} 100%)`,
      }}
    >
      <div style={{ minWidth: 0 }}>
        <div style={{ display: 'flex', alignItems: 'center', gap: 12, marginBottom: 20 }}>
          <GyreMark size={40} />
          <div>
            <Typography.Title level={2} style={{ margin: 0, color: GYRE_COLORS.primary }}>
              Gyre
            </Typography.Title>
            <Typography.Text type="secondary">
              Alpha-frequency review for EEG studies
            </Typography.Text>
          </div>
        </div>
        {/* A plain card: antd's Card brings its tabs and menus into the first download. */}
        <section
          style={{
            background: GYRE_COLORS.paper,
            border: `1px solid ${GYRE_COLORS.line}`,
            borderRadius: 8,
            padding: 24,
          }}
        >
          <Typography.Title level={1} style={{ marginTop: 0, fontSize: 20 }}>
            {title}
          </Typography.Title>
          {children}
        </section>
        <div className="gyre-above">
          <ResearchCaution />
        </div>
      </div>
    </main>
  );
}
