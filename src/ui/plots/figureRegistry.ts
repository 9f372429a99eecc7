/** The figures on screen by plot id, so panel actions (PNG, SVG, CSV) can reach the one they belong to. */
import type { Figure } from './PlotlyFigure';

export interface RegisteredFigure {
  box: HTMLDivElement;
  figure: Figure;
}

const figures = new Map<string, RegisteredFigure>();

export function registerFigure(plotId: string, entry: RegisteredFigure): void {
  figures.set(plotId, entry);
}

export function unregisterFigure(plotId: string): void {
  figures.delete(plotId);
}

export function registeredFigure(plotId: string): RegisteredFigure | undefined {
  return figures.get(plotId);
}
