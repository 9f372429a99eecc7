import { useMemo } from 'react';
import { plotThemes } from '../plotData/plotTheme';
import { buildReceiverFigure } from '../plotData/receiverEvm';
import { useAppStore } from '../state/AppStoreContext';
import { PlotlyFigure } from './PlotlyFigure';

/** EVM per subcarrier and per OFDM symbol from the reference receiver, with the standard's limit. */
export function ReceiverPlot() {
  const evm = useAppStore((state) => state.evm);
  const scheme = useAppStore((state) => state.colorScheme);
  const figure = useMemo(() => (evm.data === null ? null : buildReceiverFigure(evm.data.evm, plotThemes[scheme])), [evm.data, scheme]);
  return <PlotlyFigure drawing="canvas" figure={figure} label="EVM per subcarrier and per symbol" testId="receiver-plot" epoch={evm.seq} />;
}
