#!/usr/bin/python3
"""An engineer's scipy script for the job `npm run -s analyze -- map` does: the reference side of the
batch-map benchmark (tests/bench/batch-map-bench.ts) and of the unit test that compares the two .npy
files (tests/unit/cli/analyze-map-scipy.test.ts). Run with Debian's python3-scipy.

usage: scipy_map_script.py FILE.wav CHANNEL BLOCK OVERLAP OUT.npy

Reads one channel of a float32 or 16/32-bit integer PCM WAV through numpy.memmap, frames it as
scipy.signal.spectrogram does (hop = round(BLOCK·(1 − OVERLAP)), no padding, no detrend), applies the
periodic Hann window (scipy.signal.get_window), transforms with scipy.fft.rfft on 2 workers, and saves
the mean square per bin in dB re 1 unit — 10·lg(2|X|²/(Σw)²), |X|²/(Σw)² at DC and Nyquist, floored at
1e-30 — as float32 [frames, bins] with numpy.save.
"""
import struct
import sys

import numpy as np
import scipy.fft
import scipy.signal


def wav_channel(path, channel):
    """A memmap of one channel of a RIFF/WAVE file (fmt and data chunks, RIFF chunk walk)."""
    with open(path, 'rb') as fh:
        head = fh.read(12)
        if head[:4] != b'RIFF' or head[8:12] != b'WAVE':
            sys.exit(f'{path} is not a RIFF/WAVE file')
        fmt = None
        while True:
            chunk = fh.read(8)
            if len(chunk) < 8:
                sys.exit(f'{path} has no data chunk')
            cid, size = chunk[:4], struct.unpack('<I', chunk[4:])[0]
            if cid == b'fmt ':
                fmt = struct.unpack('<HHIIHH', fh.read(16))
                fh.seek(size - 16 + (size & 1), 1)
            elif cid == b'data':
                offset = fh.tell()
                break
            else:
                fh.seek(size + (size & 1), 1)
    tag, channels, rate, _, _, bits = fmt
    dtype = {(3, 32): '<f4', (1, 16): '<i2', (1, 32): '<i4'}.get((tag if tag != 0xFFFE else (3 if bits == 32 else 1), bits))
    if dtype is None:
        sys.exit(f'{path}: format tag {tag} with {bits} bits is not handled by this script')
    frames = size // (channels * bits // 8)
    data = np.memmap(path, dtype=dtype, mode='r', offset=offset, shape=(frames, channels))
    x = data[:, channel]
    if dtype != '<f4':
        x = x.astype(np.float32) / np.float32(2 ** (bits - 1))
    return x, rate


def main():
    path, channel, block, overlap, out = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), float(sys.argv[4]), sys.argv[5]
    x, _ = wav_channel(path, channel)
    hop = max(1, round(block * (1 - overlap)))
    frames = 1 + (len(x) - block) // hop
    w = scipy.signal.get_window('hann', block).astype(np.float32)
    segments = np.lib.stride_tricks.sliding_window_view(x, block)[::hop][:frames]
    spec = scipy.fft.rfft(segments * w, axis=-1, workers=2)
    power = spec.real * spec.real
    power += spec.imag * spec.imag
    del spec
    scale = np.float32(2 / float(w.sum(dtype=np.float64)) ** 2)
    power *= scale
    power[:, 0] *= 0.5
    power[:, -1] *= 0.5
    np.maximum(power, np.float32(1e-30), out=power)
    np.log10(power, out=power)
    power *= 10
    np.save(out, power)


main()
