#!/usr/bin/python3
"""Golden reference outputs of scikit-image's deconvolution for Stillpoint's tests.

Run with Debian's interpreter (it has python3-skimage, scipy and numpy):

    /usr/bin/python3 tools/reference/skimage_golden.py

It writes fixtures/golden/skimage-deconvolution.json, which holds
  * a 64x64 synthetic scene blurred by a 7x7 kernel with a little seeded noise,
    stored as 16-bit integers so both sides read exactly the same numbers;
  * the kernel (sum 1, odd size, centred);
  * skimage.restoration.richardson_lucy(num_iter=10, clip=False, filter_epsilon=None);
  * skimage.restoration.wiener(balance=0.05, clip=False, is_real=True) with its default
    Laplacian regulariser, and with a constant regulariser (reg = unit impulse);
  * the versions of Python, numpy, scipy and scikit-image that produced the numbers.

Boundary models of the references (what a matching Stillpoint setting must reproduce):
  * wiener is circular: it multiplies the unitary real FFT of the image by
    conj(H) / (|H|^2 + balance |R|^2), where H = ir2tf(psf) and R = ir2tf(reg) are the
    transfer functions of the centred impulse responses (skimage/restoration/uft.py).
  * richardson_lucy uses scipy.signal.convolve(mode='same'): zero outside the frame,
    starting from a constant 0.5 estimate, with eps = 1e-12 added to the denominator.

The inputs are generated here (no files are read) so the script is the whole provenance.
"""

import json
import pathlib
import platform
import sys

import numpy as np
import scipy
import scipy.signal
import skimage
from skimage import restoration

SIZE = 64
SEED = 20240601
OUT = pathlib.Path(__file__).resolve().parents[2] / "fixtures" / "golden" / "skimage-deconvolution.json"


def scene() -> np.ndarray:
    """A sharp-edged synthetic scene: bars, a disc and a ramp on a mid-grey ground."""
    y, x = np.mgrid[0:SIZE, 0:SIZE].astype(np.float64)
    img = np.full((SIZE, SIZE), 0.35)
    img[8:56, 10:14] = 0.9
    img[8:56, 18:20] = 0.9
    img[8:56, 24:25] = 0.9
    img[((x - 44) ** 2 + (y - 20) ** 2) < 81] = 0.1
    img[40:56, 34:58] = 0.2 + 0.7 * (x[40:56, 34:58] - 34) / 24
    return img


def kernel() -> np.ndarray:
    """An asymmetric 7x7 kernel (a short bent stroke) so flips and shifts show up."""
    k = np.zeros((7, 7))
    k[3, 1:6] = [1.0, 2.0, 3.0, 2.0, 1.0]
    k[2, 4] = 1.5
    k[4, 2] = 0.5
    return k / k.sum()


def quantise16(img: np.ndarray) -> np.ndarray:
    return np.round(np.clip(img, 0.0, 1.0) * 65535).astype(np.uint16)


def main() -> None:
    rng = np.random.default_rng(SEED)
    psf = kernel()
    blurred = scipy.signal.convolve(scene(), psf, mode="same")
    # The floor keeps every value positive: Richardson-Lucy divides by the model.
    noisy = 0.02 + 0.96 * blurred + rng.normal(0.0, 0.003, blurred.shape)
    stored = quantise16(noisy)
    observed = stored.astype(np.float64) / 65535

    rl = restoration.richardson_lucy(observed, psf, num_iter=10, clip=False, filter_epsilon=None)
    wiener_lap = restoration.wiener(observed, psf, balance=0.05, clip=False, is_real=True)
    wiener_const = restoration.wiener(
        observed, psf, balance=0.05, reg=np.ones((1, 1)), clip=False, is_real=True
    )

    def as_list(a: np.ndarray) -> list:
        return [float(f"{v:.10g}") for v in a.ravel()]

    doc = {
        "generator": "tools/reference/skimage_golden.py",
        "versions": {
            "python": platform.python_version(),
            "numpy": np.__version__,
            "scipy": scipy.__version__,
            "skimage": skimage.__version__,
        },
        "input": {
            "width": SIZE,
            "height": SIZE,
            "scale": 65535,
            "data": stored.ravel().tolist(),
            "note": "observed = data / scale",
        },
        "psf": {"width": 7, "height": 7, "data": as_list(psf)},
        "outputs": {
            "richardson_lucy": {
                "call": "richardson_lucy(observed, psf, num_iter=10, clip=False, filter_epsilon=None)",
                "data": as_list(rl),
            },
            "wiener_laplacian": {
                "call": "wiener(observed, psf, balance=0.05, clip=False, is_real=True)",
                "data": as_list(wiener_lap),
            },
            "wiener_constant": {
                "call": "wiener(observed, psf, balance=0.05, reg=np.ones((1, 1)), clip=False, is_real=True)",
                "data": as_list(wiener_const),
            },
        },
    }
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(json.dumps(doc, separators=(",", ":")) + "\n")
    print(f"wrote {OUT} with skimage {skimage.__version__}", file=sys.stderr)


if __name__ == "__main__":
    main()
