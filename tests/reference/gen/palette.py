"""Design and check Strata's categorical palette; write colour fixtures.

Run with /work/venv/bin/python from the repository root:
    python tests/reference/gen/palette.py [--design-lead | --design]

Generated with numpy 2.4.6 and colour-science 0.4.7 (Python 3.11).

--design-lead designs the categorical palette "harbour" as it is now:
deep teal, copper and slate blue-grey lead, five more hues searched (see
design_lead). --design was the first version's search: eight
colours in two matched OKLCH lightness tiers (0.54 and 0.65, alternating
round the hue circle; a single lightness reached only 0.028 below),
chroma as high as sRGB allows up to 0.16, hues at least 28 degrees apart,
chosen to maximise the smallest pairwise OKLab distance over normal vision
and full protanopia, deuteranopia and tritanopia as simulated by Machado,
Oliveira & Fernandes (2009) matrices (severity 1.0) applied to linear sRGB.
The chosen hex values are then copied into color/mod.rs (reordered so
neighbours in use differ in tier and hue).

Without --design it writes the fixtures the Rust tests read:
  tests/reference/fixtures/color/oklab.json   sRGB hex -> OKLab (colour-science)
  tests/reference/fixtures/color/cvd.json     Machado 2009 matrices and simulated colours
"""
import itertools
import json
import sys
import warnings

warnings.filterwarnings("ignore")
import colour  # noqa: E402
import numpy as np  # noqa: E402

CVD = {"protan": "Protanomaly", "deutan": "Deuteranomaly", "tritan": "Tritanomaly"}


def hex_to_srgb(h):
    h = h.lstrip("#")
    return np.array([int(h[i:i + 2], 16) / 255 for i in (0, 2, 4)])


def srgb_to_hex(c):
    c = np.clip(np.round(np.asarray(c) * 255), 0, 255).astype(int)
    return "#%02x%02x%02x" % tuple(c)


def lin(c):
    return colour.models.eotf_sRGB(c)


def enc(c):
    return colour.models.eotf_inverse_sRGB(np.clip(c, 0, 1))


def lin_to_oklab(rgb_lin):
    xyz = colour.RGB_to_XYZ(rgb_lin, colour.RGB_COLOURSPACES["sRGB"], apply_cctf_decoding=False)
    return colour.XYZ_to_Oklab(xyz)


def oklch_to_lin(L, C, h):
    a, b = C * np.cos(np.radians(h)), C * np.sin(np.radians(h))
    xyz = colour.Oklab_to_XYZ(np.array([L, a, b]))
    return colour.XYZ_to_RGB(xyz, colour.RGB_COLOURSPACES["sRGB"], apply_cctf_encoding=False)


def max_chroma(L, h, cap):
    lo, hi = 0.0, cap
    for _ in range(30):
        mid = (lo + hi) / 2
        rgb = oklch_to_lin(L, mid, h)
        if np.all(rgb >= -1e-6) and np.all(rgb <= 1 + 1e-6):
            lo = mid
        else:
            hi = mid
    return lo


def simulate(rgb_lin, kind):
    M = colour.blindness.matrix_cvd_Machado2009(CVD[kind], 1.0)
    return np.clip(M @ rgb_lin, 0, 1)


def min_dist(cols_lin):
    worst = 9.0
    for kind in [None, "protan", "deutan", "tritan"]:
        labs = [lin_to_oklab(c if kind is None else simulate(c, kind)) for c in cols_lin]
        for a, b in itertools.combinations(labs, 2):
            worst = min(worst, float(np.linalg.norm(a - b)))
    return worst


# Fast path for the search: Ottosson (2020) matrices in plain numpy.
M_RGB_LMS = np.array([[0.4122214708, 0.5363325363, 0.0514459929], [0.2119034982, 0.6806995451, 0.1073969566], [0.0883024619, 0.2817188376, 0.6299787005]])
M_LMS_LAB = np.array([[0.2104542553, 0.7936177850, -0.0040720468], [1.9779984951, -2.4285922050, 0.4505937099], [0.0259040371, 0.7827717662, -0.8086757660]])
M_LAB_LMS = np.linalg.inv(M_LMS_LAB)
M_LMS_RGB = np.linalg.inv(M_RGB_LMS)


def fast_lab(rgb):
    return np.cbrt(rgb @ M_RGB_LMS.T) @ M_LMS_LAB.T


def fast_lin(L, C, h):
    lab = np.stack([np.full_like(h, L), C * np.cos(np.radians(h)), C * np.sin(np.radians(h))], -1)
    return (lab @ M_LAB_LMS.T) ** 3 @ M_LMS_RGB.T


def fast_max_chroma(L, h, cap):
    lo, hi = np.zeros_like(h), np.full_like(h, cap)
    for _ in range(25):
        mid = (lo + hi) / 2
        rgb = fast_lin(L, mid, h)
        ok = np.all((rgb >= -1e-6) & (rgb <= 1 + 1e-6), -1)
        lo, hi = np.where(ok, mid, lo), np.where(ok, hi, mid)
    return lo


MATS = [np.eye(3)] + [colour.blindness.matrix_cvd_Machado2009(v, 1.0) for v in CVD.values()]


def fast_min_dist(rgb):
    worst = 9.0
    iu = np.triu_indices(len(rgb), 1)
    for M in MATS:
        lab = fast_lab(np.clip(rgb @ M.T, 0, 1))
        d = np.linalg.norm(lab[:, None, :] - lab[None, :, :], axis=-1)[iu]
        worst = min(worst, float(d.min()))
    return worst


def tier_lin(Ls, C, h):
    lab = np.stack([Ls, C * np.cos(np.radians(h)), C * np.sin(np.radians(h))], -1)
    return (lab @ M_LAB_LMS.T) ** 3 @ M_LMS_RGB.T


def tier_max_chroma(Ls, h, cap):
    lo, hi = np.zeros_like(h), np.full_like(h, cap)
    for _ in range(25):
        mid = (lo + hi) / 2
        rgb = tier_lin(Ls, mid, h)
        ok = np.all((rgb >= -1e-6) & (rgb <= 1 + 1e-6), -1)
        lo, hi = np.where(ok, mid, lo), np.where(ok, hi, mid)
    return lo


def design(low=0.54, high=0.65, cap=0.16, n=8, min_gap=28):
    """Two lightness tiers (alternating round the hue circle), hues at least
    `min_gap` degrees apart, chroma at the sRGB limit up to `cap`; maximise
    the smallest OKLab distance over normal vision and the three simulations."""
    Ls = np.where(np.arange(n) % 2 == 0, low, high)

    def score(h):
        hs = np.sort(h % 360)
        gap = np.min(np.diff(np.concatenate([hs, [hs[0] + 360]])))
        return fast_min_dist(tier_lin(Ls, tier_max_chroma(Ls, h, cap), h)) - (0 if gap >= min_gap else 1)

    rng = np.random.default_rng(1)
    best = None
    for _ in range(20000):
        h = np.sort(rng.uniform(0, 360, n))
        d = score(h)
        if best is None or d > best[0]:
            best = (d, h)
    d, h = best
    for step in [10, 5, 2, 1]:
        improved = True
        while improved:
            improved = False
            for i in range(n):
                for s in (-step, step):
                    h2 = h.copy()
                    h2[i] = (h2[i] + s) % 360
                    d2 = score(h2)
                    if d2 > d:
                        d, h, improved = d2, h2, True
    rgb = tier_lin(Ls, tier_max_chroma(Ls, h, cap), h)
    cols = [srgb_to_hex(enc(c)) for c in rgb]
    print("min distance", d, "checked with colour-science:", min_dist([lin(hex_to_srgb(c)) for c in cols]))
    for i in np.argsort(h):
        print(round(float(h[i]), 1), Ls[i], cols[i])


def fixtures():
    sys.path.insert(0, ".")
    samples = ["#000000", "#ffffff", "#ff0000", "#00ff00", "#0000ff", "#808080", "#3c7ebe", "#b55f40", "#ffcc00", "#123456", "#fedcba"]
    ok = []
    for h in samples:
        lab = lin_to_oklab(lin(hex_to_srgb(h)))
        ok.append({"hex": h, "oklab": [round(float(v), 10) for v in lab]})
    xyz = []
    for X in [[0.950, 1.000, 1.089], [1, 0, 0], [0, 1, 0], [0, 0, 1]]:
        xyz.append({"xyz": X, "oklab": [round(float(v), 10) for v in colour.XYZ_to_Oklab(np.array(X, dtype=float))]})
    mats = {k: colour.blindness.matrix_cvd_Machado2009(v, 1.0).tolist() for k, v in CVD.items()}
    sims = []
    for h in samples:
        for k in CVD:
            sims.append({"hex": h, "kind": k, "linear": [round(float(v), 10) for v in simulate(lin(hex_to_srgb(h)), k)]})
    meta = {"generator": "tests/reference/gen/palette.py", "colour-science": colour.__version__, "numpy": np.__version__}
    with open("tests/reference/fixtures/color/oklab.json", "w") as f:
        json.dump({"meta": meta, "srgb": ok, "xyz": xyz}, f, indent=0)
    with open("tests/reference/fixtures/color/cvd.json", "w") as f:
        json.dump({"meta": meta, "matrices": mats, "simulated": sims}, f, indent=0)


def design_lead(seed=11, starts=4000):
    """The palette "harbour" as it is now: three lead hues fixed by intent,
    the other five searched. 1 deep teal (hue 185-215, lower tier 0.54),
    2 copper (hue 40-65, upper tier 0.65), 3 slate blue-grey (hue 235-275,
    upper tier, chroma at most 0.05), then five hues anywhere (tiers
    0.54, 0.65, 0.54, 0.54, 0.65, so four colours in each tier), chroma at the
    sRGB limit up to 0.16, each keeping 3:1 against white. Maximise the smallest pairwise OKLab distance
    over normal vision and full protanopia, deuteranopia and tritanopia
    (Machado et al. 2009, severity 1.0). color/mod.rs then orders the five
    searched colours so neighbouring colours differ in tier."""
    Ls = np.array([0.54, 0.65, 0.65, 0.54, 0.65, 0.54, 0.54, 0.65])
    caps = np.array([0.16, 0.16, 0.05, 0.16, 0.16, 0.16, 0.16, 0.16])

    def lin_of(x):
        return tier_lin(Ls, np.minimum(tier_max_chroma(Ls, x, 0.16), caps), x)

    def score(x):
        # WCAG 2.1 3:1 against white needs relative luminance at most 0.30.
        rgb = lin_of(x)
        bright = float(np.max(np.clip(rgb, 0, 1) @ np.array([0.2126, 0.7152, 0.0722])))
        return fast_min_dist(rgb) - (0 if bright <= 0.295 else 1)

    lo = np.array([185, 40, 235] + [-1e9] * 5)
    hi = np.array([215, 65, 275] + [1e9] * 5)
    rng = np.random.default_rng(seed)
    best = None
    for _ in range(starts):
        x = np.concatenate([[rng.uniform(185, 215), rng.uniform(40, 65), rng.uniform(235, 275)], rng.uniform(0, 360, 5)])
        d = score(x)
        if best is None or d > best[0]:
            best = (d, x)
    d, x = best
    for step in [8, 4, 2, 1]:
        improved = True
        while improved:
            improved = False
            for i in range(8):
                for s in (-step, step):
                    x2 = x.copy()
                    x2[i] += s
                    if lo[i] <= x2[i] <= hi[i]:
                        d2 = score(x2)
                        if d2 > d:
                            d, x, improved = d2, x2, True
    cols = [srgb_to_hex(enc(c)) for c in lin_of(x)]
    print("min distance", d, "checked with colour-science:", min_dist([lin(hex_to_srgb(c)) for c in cols]))
    for h, L, c in zip(x, Ls, cols):
        print(round(float(h) % 360, 1), L, c)


if __name__ == "__main__":
    if "--design-lead" in sys.argv:
        design_lead()
    elif "--design" in sys.argv:
        design()
    else:
        fixtures()
