#!/usr/bin/python3
"""The scipy side of `npm run bench`: the same map as Fanlight's on the same float32 samples.

usage: scipy_map_bench.py SAMPLES.f32 FS BLOCK HOP REPEATS
Prints one JSON line: the best time of scipy.fft.rfft over the windowed frames (float32, batched,
one call), and of the whole map (framing, window, rfft, power) in float32.
"""
import json
import sys
import time

import numpy as np
import scipy
import scipy.fft
import scipy.signal

path, fs, block, hop, repeats = sys.argv[1], float(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4]), int(sys.argv[5])
x = np.fromfile(path, dtype=np.float32)
frames = 1 + (len(x) - block) // hop
w = scipy.signal.get_window('hann', block).astype(np.float32)
view = np.lib.stride_tricks.sliding_window_view(x, block)[::hop][:frames]
windowed = (view * w).astype(np.float32)
scipy.fft.rfft(windowed[:8], axis=-1)

best_fft = best_map = float('inf')
for _ in range(repeats):
    t0 = time.perf_counter()
    scipy.fft.rfft(windowed, axis=-1)
    best_fft = min(best_fft, time.perf_counter() - t0)
    t0 = time.perf_counter()
    spec = scipy.fft.rfft(np.lib.stride_tricks.sliding_window_view(x, block)[::hop][:frames] * w, axis=-1)
    power = (spec.real * spec.real + spec.imag * spec.imag).astype(np.float32)
    best_map = min(best_map, time.perf_counter() - t0)
print(json.dumps({'frames': frames, 'rfftS': best_fft, 'mapS': best_map, 'scipy': scipy.__version__, 'numpy': np.__version__}))
