import { Outlet, ScrollRestoration, useNavigation } from 'react-router-dom';
import { AppShell } from '../../components/layout/app-shell';
import { isNonProduction, useHealth } from '../../features/health/api/get-health';

/** The root layout: the shell around every page, with the dev links only where they can work. */
export function RootLayout() {
  const health = useHealth();
  const navigation = useNavigation();
  const showDevLinks = import.meta.env.DEV || isNonProduction(health.data);
  return (
    <AppShell showDevLinks={showDevLinks} isNavigating={navigation.state === 'loading'}>
      <Outlet />
      <ScrollRestoration />
    </AppShell>
  );
}
