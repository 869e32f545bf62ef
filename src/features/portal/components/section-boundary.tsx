import { Component, type ReactNode } from 'react'
import { ErrorState } from '#src/components/ui/states.tsx'

/** Keeps one failing portal section from taking the page down; says what to do next. */
export class SectionBoundary extends Component<{ children: ReactNode; title: string }, { error: unknown }> {
  state = { error: null as unknown }
  static getDerivedStateFromError(error: unknown) {
    return { error }
  }
  render() {
    if (this.state.error) {
      return (
        <ErrorState
          error={new Error(`${this.props.title} could not be shown. Reload the page, or ask the shop if it keeps happening.`)}
          retry={() => this.setState({ error: null })}
        />
      )
    }
    return this.props.children
  }
}
