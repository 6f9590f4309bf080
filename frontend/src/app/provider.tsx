import { App as AntApp, ConfigProvider } from 'antd';
import enGB from 'antd/locale/en_GB';
import { SWRConfig } from 'swr';
import { ApiError, fetcher } from '../lib/api-client';
import { gyreTheme } from './theme';

/** The one theme provider and the one data-fetching setup. */
export function AppProvider({ children }: { children: React.ReactNode }) {
  return (
    <ConfigProvider theme={gyreTheme} locale={enGB}>
      <AntApp>
        <SWRConfig
          value={{
            fetcher,
            // A 4xx will not change by asking again; network and 5xx errors may.
            shouldRetryOnError: (error: unknown) =>
              !(error instanceof ApiError && error.status >= 400 && error.status < 500),
            revalidateOnFocus: false,
          }}
        >
          {children}
        </SWRConfig>
      </AntApp>
    </ConfigProvider>
  );
}
