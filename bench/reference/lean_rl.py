#!/usr/bin/python3
"""Speed references for Richardson-Lucy on one large channel (not product code).

    /usr/bin/python3 bench/reference/lean_rl.py CHANNEL.f32 HEIGHT WIDTH KERNEL.f64 SIZE ITER [--skimage]

Times, in the same process and on the same data:
  * lean: Richardson-Lucy (Richardson, JOSA 1972; Lucy, AJ 1974) on scipy.fft (pocketfft) with
    the kernel's transfer function computed once, real FFTs of a fast size, two worker threads,
    circular boundary: the leanest reasonable NumPy formulation;
  * with --skimage: skimage.restoration.richardson_lucy as shipped (scipy.signal.convolve
    with mode='same' per step).
Prints one JSON line with seconds per run and the library versions.
"""

import json
import sys
import time

import numpy as np
import scipy
import scipy.fft as sfft
import skimage
from skimage import restoration


def lean_rl(image, psf, num_iter, workers=2):
    h, w = image.shape
    ph, pw = sfft.next_fast_len(h, real=True), sfft.next_fast_len(w, real=True)
    # Kernel centred at the origin so the circular convolution does not shift the image.
    kpad = np.zeros((ph, pw), dtype=np.float32)
    k = psf.shape[0]
    kpad[:k, :k] = psf
    kpad = np.roll(kpad, (-(k // 2), -(k // 2)), axis=(0, 1))
    otf = sfft.rfft2(kpad, workers=workers)
    otf_conj = np.conj(otf)
    padded = np.zeros((ph, pw), dtype=np.float32)
    padded[:h, :w] = image
    padded[h:, :] = padded[:h, :].mean()
    padded[:, w:] = padded[:h, :w].mean()
    est = np.full_like(padded, padded.mean())
    for _ in range(num_iter):
        model = sfft.irfft2(sfft.rfft2(est, workers=workers) * otf, s=(ph, pw), workers=workers)
        ratio = padded / np.maximum(model, 1e-12)
        est *= sfft.irfft2(sfft.rfft2(ratio, workers=workers) * otf_conj, s=(ph, pw), workers=workers)
    return est[:h, :w]


def main():
    path, h, w, kpath, k, num_iter = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), sys.argv[4], int(sys.argv[5]), int(sys.argv[6])
    image = np.fromfile(path, dtype="<f4").reshape((h, w))
    psf = np.fromfile(kpath, dtype="<f8").reshape((k, k)).astype(np.float32)
    out = {"script": "bench/reference/lean_rl.py", "versions": {"numpy": np.__version__, "scipy": scipy.__version__, "skimage": skimage.__version__}}
    t0 = time.perf_counter()
    lean = lean_rl(image, psf, num_iter)
    out["leanSeconds"] = time.perf_counter() - t0
    out["leanFinite"] = bool(np.isfinite(lean).all())
    if "--skimage" in sys.argv:
        t0 = time.perf_counter()
        ref = restoration.richardson_lucy(image, psf, num_iter=num_iter, clip=False)
        out["skimageSeconds"] = time.perf_counter() - t0
        out["skimageFinite"] = bool(np.isfinite(ref).all())
    print(json.dumps(out))


if __name__ == "__main__":
    main()
