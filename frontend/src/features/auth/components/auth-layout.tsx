import { Typography } from 'antd';
import { GyreMark } from '../../../components/gyre-mark';
import { ResearchCaution } from '../../../components/research-caution';

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
        background: 'linear-gradient(160deg, #F4F7F7 0%, #E3ECEC 100%)',
      }}
    >
      <div style={{ minWidth: 0 }}>
        <div style={{ display: 'flex', alignItems: 'center', gap: 12, marginBottom: 20 }}>
          <GyreMark size={40} />
          <div>
            <Typography.Title level={2} style={{ margin: 0, color: '#24525A' }}>
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
            background: '#FFFFFF',
            border: '1px solid #DCE5E6',
            borderRadius: 8,
            padding: 24,
          }}
        >
          <Typography.Title level={1} style={{ marginTop: 0, fontSize: 20 }}>
            {title}
          </Typography.Title>
          {children}
        </section>
        <div style={{ marginTop: 16 }}>
          <ResearchCaution />
        </div>
      </div>
    </main>
  );
}
