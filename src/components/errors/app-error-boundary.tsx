import { Component, type ErrorInfo, type ReactNode } from 'react';
import { describeError, ErrorFallback } from './error-fallback';

interface AppErrorBoundaryProps {
  children: ReactNode;
}

interface AppErrorBoundaryState {
  error: unknown;
  hasError: boolean;
}

/** The last line of defence around the whole app, above the router and the providers. */
export class AppErrorBoundary extends Component<AppErrorBoundaryProps, AppErrorBoundaryState> {
  override state: AppErrorBoundaryState = { error: undefined, hasError: false };

  static getDerivedStateFromError(error: unknown): AppErrorBoundaryState {
    return { error, hasError: true };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.error('Hilum stopped with an error', error, info.componentStack);
  }

  override render(): ReactNode {
    if (!this.state.hasError) return this.props.children;
    return (
      <ErrorFallback
        fullPage
        title="Hilum ran into a problem"
        detail={describeError(this.state.error)}
        onRetry={() => this.setState({ error: undefined, hasError: false })}
      />
    );
  }
}
