"""Reference timing for `npm run bench`: the per-symbol PAPR CCDF workload, vectorised with numpy.

numpy is a benchmark reference only, never a dependency of Crestline: bench/run.ts runs this script when
`python3 -c "import numpy"` works and prints Crestline/numpy ratios; without numpy it skips that column.

Work per OFDM symbol (the same as the bench's Crestline workers do):
  random QPSK on the active subcarriers (optionally DFT-spread, unitary, for DFT-s-OFDM),
  placed at the IFFT bins of an LTE 20 MHz grid (1200 subcarriers, 2048 x oversampling points, zero padded),
  unscaled IFFT, instantaneous power |x|^2, per-symbol peak and mean, PAPR = peak / mean,
  histogram of PAPR in 0.01 dB bins (0..20 dB), from which the CCDF follows.

Usage: python3 bench/numpy_ccdf.py --waveform ofdm|dft-s-ofdm --symbols N [--oversampling 4] [--batch 16] [--dtype complex128|complex64]
Prints one JSON line: {"symbolsPerSecond": ..., "symbols": ..., "seconds": ..., "numpy": "<version>", "paprDbAt1e-2": ...}
"""
import argparse
import json
import time

import numpy as np


def lte20_bins(ifft_size, uplink):
    """IFFT bins of the 1200 grid subcarriers: k = k' - 600, downlink skips DC (TS 36.211 s6.12)."""
    k = np.arange(1200) - 600
    if not uplink:
        k = np.where(k >= 0, k + 1, k)
    return np.mod(k, ifft_size)


def run(waveform, num_symbols, oversampling, batch, seed, dtype):
    n = 2048 * oversampling
    spread = waveform == "dft-s-ofdm"
    bins = lte20_bins(n, uplink=spread)
    rng = np.random.default_rng(seed)
    qpsk = (np.array([1 + 1j, 1 - 1j, -1 + 1j, -1 - 1j]) / np.sqrt(2)).astype(dtype)
    edges_per_db = 100
    hist = np.zeros(20 * edges_per_db + 1, dtype=np.int64)
    freq = np.zeros((batch, n), dtype=dtype)
    done = 0
    start = time.perf_counter()
    while done < num_symbols:
        b = min(batch, num_symbols - done)
        symbols = qpsk[rng.integers(0, 4, size=(b, 1200))]
        if spread:
            symbols = np.fft.fft(symbols, axis=1, norm="ortho")
        f = freq[:b]
        f[:, bins] = symbols
        x = np.fft.ifft(f, axis=1)
        p = x.real * x.real + x.imag * x.imag
        papr_db = 10 * np.log10(p.max(axis=1) / p.mean(axis=1))
        idx = np.clip((papr_db * edges_per_db).astype(np.int64), 0, hist.size - 1)
        hist += np.bincount(idx, minlength=hist.size)
        done += b
    seconds = time.perf_counter() - start
    ccdf = 1 - np.cumsum(hist) / hist.sum()
    level = float(np.argmax(ccdf <= 1e-2)) / edges_per_db
    return {
        "symbolsPerSecond": num_symbols / seconds,
        "symbols": num_symbols,
        "seconds": seconds,
        "numpy": np.__version__,
        "dtype": np.dtype(dtype).name,
        "paprDbAt1e-2": level,
    }


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--waveform", choices=["ofdm", "dft-s-ofdm"], default="ofdm")
    parser.add_argument("--symbols", type=int, default=20000)
    parser.add_argument("--oversampling", type=int, default=4)
    parser.add_argument("--batch", type=int, default=16)
    parser.add_argument("--dtype", choices=["complex128", "complex64"], default="complex128")
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    # Warm-up batch: numpy's FFT plan cache and the allocator.
    dtype = np.complex128 if args.dtype == "complex128" else np.complex64
    run(args.waveform, args.batch, args.oversampling, args.batch, args.seed, dtype)
    print(json.dumps(run(args.waveform, args.symbols, args.oversampling, args.batch, args.seed, dtype)))


if __name__ == "__main__":
    main()
