#!/usr/bin/python3
"""Best-tuned scikit-image deconvolution for each benchmark case (a reference, not product code).

    /usr/bin/python3 bench/reference/skimage_best.py MANIFEST.json

The manifest (written by bench/quality.ts) lists cases, each with float32 little-endian files
for the blurred input and the sharp truth (planes x height x width, sRGB-encoded values in
[0, 1]) and a float64 kernel (size x size, sum 1). For every case this script tries

  * skimage.restoration.wiener(balance=b, clip=False, is_real=True) with its default
    Laplacian regulariser, b swept over a log grid, and
  * skimage.restoration.richardson_lucy(num_iter=n, clip=False), n swept,

each applied per channel both to the values as given and in linear light (sRGB decode before,
encode after, IEC 61966-2-1), and keeps, per method, the setting with the highest PSNR against
the truth: tuned on the truth, an upper bound a user could not reach. It writes the winning
outputs next to the inputs and prints one JSON document with the choices and library versions.

Speed: richardson_lucy restarts from 0.5 for every num_iter, so the search walks one run of
`rl_snapshots`, a line-for-line copy of skimage 0.19's loop that keeps the iterates at the grid
points; the output written for the winner is then computed again by the library function itself
and the run fails if the two differ. Cases are spread over two processes (the machine has two cores).
"""

import json
import multiprocessing
import sys
import time

import numpy as np
import scipy
import scipy.signal
import skimage
from skimage import restoration

BALANCES = np.logspace(-5, 1, 25)
ITERATIONS = [1, 2, 3, 5, 8, 12, 18, 25, 35, 50, 75, 110]


def srgb_to_linear(c):
    return np.where(c <= 0.04045, c / 12.92, ((c + 0.055) / 1.055) ** 2.4)


def linear_to_srgb(v):
    v = np.clip(v, 0.0, None)
    return np.where(v <= 0.0031308, 12.92 * v, 1.055 * v ** (1 / 2.4) - 0.055)


def psnr(a, b):
    """Mean over channels of 10 log10(1 / MSE), on values clamped to [0, 1] as a stored file would be."""
    a = np.clip(a, 0.0, 1.0)
    return float(np.mean([10 * np.log10(1.0 / np.mean((a[c] - b[c]) ** 2)) for c in range(a.shape[0])]))


def per_channel(fn, img):
    return np.stack([fn(img[c]) for c in range(img.shape[0])])


def domains(img):
    yield "as-given", img, lambda x: x
    yield "linear", srgb_to_linear(img), linear_to_srgb


def best_wiener(blurred, truth, psf):
    best = None
    for domain, data, back in domains(blurred):
        for b in BALANCES:
            out = back(per_channel(lambda ch: restoration.wiener(ch, psf, balance=b, clip=False, is_real=True), data))
            score = psnr(out, truth)
            if best is None or score > best[0]:
                best = (score, {"balance": float(b), "domain": domain}, out)
    return best


def rl_snapshots(image, psf, iterations):
    """skimage 0.19.3 richardson_lucy (filter_epsilon=None, clip=False), returning the iterate after each count in `iterations`."""
    im_deconv = np.full(image.shape, 0.5, dtype=image.dtype)
    psf_mirror = np.flip(psf)
    eps = 1e-12
    snaps = {}
    for i in range(1, max(iterations) + 1):
        conv = scipy.signal.convolve(im_deconv, psf, mode="same") + eps
        relative_blur = image / conv
        im_deconv *= scipy.signal.convolve(relative_blur, psf_mirror, mode="same")
        if i in iterations:
            snaps[i] = im_deconv.copy()
    return snaps


def best_rl(blurred, truth, psf):
    best = None
    for domain, data, back in domains(blurred):
        per_ch = [rl_snapshots(data[c], psf, ITERATIONS) for c in range(data.shape[0])]
        for n in ITERATIONS:
            out = back(np.stack([snaps[n] for snaps in per_ch]))
            score = psnr(out, truth)
            if best is None or score > best[0]:
                best = (score, {"num_iter": n, "domain": domain}, out)
    score, params, replica = best
    back = dict((d, b) for d, _, b in domains(blurred))[params["domain"]]
    data = dict((d, x) for d, x, _ in domains(blurred))[params["domain"]]
    out = back(per_channel(lambda ch: restoration.richardson_lucy(ch, psf, num_iter=params["num_iter"], clip=False), data))
    if not np.allclose(out, replica, rtol=0, atol=1e-9):
        raise RuntimeError("snapshot replica of richardson_lucy disagrees with the library")
    return psnr(out, truth), params, out


def run_case(case):
    shape = (case["channels"], case["height"], case["width"])
    blurred = np.fromfile(case["blurred"], dtype="<f4").reshape(shape).astype(np.float64)
    truth = np.fromfile(case["truth"], dtype="<f4").reshape(shape).astype(np.float64)
    k = case["kernelSize"]
    psf = np.fromfile(case["kernel"], dtype="<f8").reshape((k, k))
    entry = {"id": case["id"]}
    for name, search in (("wiener", best_wiener), ("richardson_lucy", best_rl)):
        t0 = time.perf_counter()
        score, params, out = search(blurred, truth, psf)
        path = f"{case['outPrefix']}.skimage-{name}.f32"
        out.astype("<f4").tofile(path)
        grid_value = params.get("balance", params.get("num_iter"))
        grid = BALANCES.tolist() if name == "wiener" else ITERATIONS
        entry[name] = {
            "psnr": score,
            "params": params,
            "output": path,
            "searchSeconds": time.perf_counter() - t0,
            # A winner on the edge of the grid means the optimum may lie outside it.
            "atGridEdge": bool(grid_value in (grid[0], grid[-1])),
        }
    print(f"skimage_best: {case['id']} done", file=sys.stderr, flush=True)
    return entry


def main():
    manifest = json.load(open(sys.argv[1]))
    with multiprocessing.Pool(2) as pool:
        results = pool.map(run_case, manifest["cases"], chunksize=1)
    json.dump(
        {
            "script": "bench/reference/skimage_best.py",
            "versions": {"numpy": np.__version__, "scipy": scipy.__version__, "skimage": skimage.__version__},
            "grid": {"balance": BALANCES.tolist(), "num_iter": ITERATIONS, "domains": ["as-given", "linear"]},
            "results": results,
        },
        sys.stdout,
    )


if __name__ == "__main__":
    main()
