import { Alert, Button, Skeleton } from 'antd';
import { Outlet, useNavigation, useRouteError } from 'react-router-dom';
import { GYRE_COLORS } from './theme';
import '../components/app-frame.css';

/**
 * The root of every route: the screen, and a thin bar at the top of the window while the
 * router fetches the next screen's code. The screen being left stays until the next one is
 * ready, so nothing flashes in between.
 */
export function RouteShell() {
  const navigation = useNavigation();
  return (
    <>
      {navigation.state === 'loading' ? (
        <div role="progressbar" aria-label="Opening the screen" className="gyre-route-progress" />
      ) : null}
      <Outlet />
    </>
  );
}

/**
 * What the window shows while a signed-in screen's code arrives on a fresh load: the outline
 * of the app frame (its header band, then grey rows), never another screen.
 */
export function FirstScreenLoading() {
  return (
    <div role="status" aria-busy="true" aria-label="Opening Gyre" className="gyre-full-height">
      <div
        className="gyre-frame-outline-header"
        style={{ background: GYRE_COLORS.paper, borderBottom: `1px solid ${GYRE_COLORS.line}` }}
      />
      <div className="gyre-frame-outline-main">
        <Skeleton active title paragraph={{ rows: 6 }} />
      </div>
    </div>
  );
}

/**
 * A screen whose code could not be fetched (the connection dropped, or Gyre was updated while
 * this window was open and the old files are gone): reloading fetches the current ones. Built
 * only from pieces of the first download, so it shows even when nothing else arrives.
 */
export function RouteError() {
  const error = useRouteError();
  const detail = error instanceof Error ? error.message : null;
  return (
    <div className="gyre-route-error">
      <Alert
        type="error"
        showIcon
        title="Gyre could not open this screen"
        description={
          <>
            <p className="gyre-flush-top">
              Reload the page to try again. If it keeps happening, tell your administrator.
            </p>
            {detail === null ? null : <p className="gyre-flush-bottom">{detail}</p>}
          </>
        }
        action={
          <Button type="primary" onClick={() => window.location.reload()}>
            Reload
          </Button>
        }
      />
    </div>
  );
}
