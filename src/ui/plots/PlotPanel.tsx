import type { ReactNode } from 'react';
import { PlotExportButtons } from './PlotExportButtons';

export interface PlotPanelProps {
  /** Panel heading (our own name for the view). */
  title: string;
  /** Stable id for tests, screenshots and the export menu. */
  panelId: string;
  /** "wide" spans both plot columns. */
  size?: 'wide' | 'half';
  /** Controls shown in the heading row (run buttons, export). */
  actions?: ReactNode;
  /** The plot's id (its PlotlyFigure testId): adds PNG, SVG and CSV export buttons. */
  exportId?: string;
  /** A line under the plot (method, source, what is shown). */
  footnote?: ReactNode;
  children: ReactNode;
}

/** A titled panel around one plot; the plot box inside has a fixed height, so nothing jumps while it updates. */
export function PlotPanel({ title, panelId, size = 'half', actions, exportId, footnote, children }: PlotPanelProps) {
  const headingId = `${panelId}-heading`;
  return (
    <section className={`panel plot-panel plot-${size}`} aria-labelledby={headingId} data-panel={panelId}>
      <div className="plot-panel-head">
        <h2 id={headingId}>{title}</h2>
        {(actions !== undefined || exportId !== undefined) && (
          <div className="plot-actions">
            {actions}
            {exportId !== undefined && <PlotExportButtons plotId={exportId} fileStem={`crestline-${panelId}`} title={title} />}
          </div>
        )}
      </div>
      {children}
      {footnote !== undefined && <p className="plot-footnote">{footnote}</p>}
    </section>
  );
}
