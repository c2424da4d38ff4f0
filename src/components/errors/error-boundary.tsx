import { Component, type ErrorInfo, type ReactNode } from 'react';
import { errorMessage } from '../../lib/error-message';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';

interface Props {
  /** What the region is, for the message: "The map", "The view". */
  region: string;
  children: ReactNode;
}

interface State {
  error: unknown;
}

/**
 * Keeps a failure in one region of a page from blanking the whole page: the region says what went wrong
 * and offers to try again; the rest of the page stays usable. (React catches render errors only in a class
 * component with getDerivedStateFromError.)
 */
export class ErrorBoundary extends Component<Props, State> {
  state: State = { error: null };

  static getDerivedStateFromError(error: unknown): State {
    return { error };
  }

  componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.error(`${this.props.region} failed:`, error, info.componentStack);
  }

  render() {
    if (this.state.error === null) return this.props.children;
    return (
      <div className="flex flex-col items-start gap-2 p-4">
        <Notice tone="error">
          {this.props.region} could not be shown: {errorMessage(this.state.error)}
        </Notice>
        <Button type="button" variant="quiet" onClick={() => this.setState({ error: null })}>
          Try again
        </Button>
      </div>
    );
  }
}
