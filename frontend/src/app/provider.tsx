import { App as AntApp, ConfigProvider } from 'antd';
import enGB from 'antd/locale/en_GB';
import { SWRConfig } from 'swr';
import { ApiError, fetcher } from '../lib/api-client';
import { gyreTheme } from './theme';

/** The one theme and the one data-fetching setup: all the sign-in page needs around it. */
export function ThemeAndDataProvider({ children }: { children: React.ReactNode }) {
  return (
    <ConfigProvider theme={gyreTheme} locale={enGB}>
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
    </ConfigProvider>
  );
}

/**
 * The theme and data setup with antd's App (the message, modal and notification hooks of
 * `App.useApp()`) inside: what every signed-in screen sits in. The running client adds App in
 * the session gate, so that the sign-in page does not download it; tests render screens here.
 */
export function AppProvider({ children }: { children: React.ReactNode }) {
  return (
    <ThemeAndDataProvider>
      <AntApp>{children}</AntApp>
    </ThemeAndDataProvider>
  );
}
