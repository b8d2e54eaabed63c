import { Component, type ErrorInfo, type ReactNode } from 'react';

type ErrorBoundaryProps = {
  fallback: ReactNode;
  children: ReactNode;
  /** When this changes (e.g. the address moved on), a shown fallback gives way to the children again. */
  resetKey?: unknown;
};

type ErrorBoundaryState = { failed: boolean };

/**
 * Catches a render crash anywhere below it and shows `fallback` instead of a blank page.
 * The error goes to the browser console for whoever is debugging, never onto the screen.
 */
export class ErrorBoundary extends Component<ErrorBoundaryProps, ErrorBoundaryState> {
  override state: ErrorBoundaryState = { failed: false };

  static getDerivedStateFromError(): ErrorBoundaryState {
    return { failed: true };
  }

  override componentDidUpdate(previous: ErrorBoundaryProps): void {
    if (this.state.failed && previous.resetKey !== this.props.resetKey)
      this.setState({ failed: false });
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.error('Luxtempo screen failed to render', error, info.componentStack);
  }

  override render(): ReactNode {
    return this.state.failed ? this.props.fallback : this.props.children;
  }
}
