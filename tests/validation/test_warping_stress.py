"""Restrained-warping stresses of a thin I-section against the thin-walled formulas.

Source: thin-walled (Vlasov) theory as in AISC Design Guide 9 (Seaburg & Carter, 1997),
sigma_w = E W_n phi'' with the normalised sectorial coordinate W_n = b h / 4 at the flange tip
(linear along the flange, W_n = x h / 2), and tau_w = T_w S_w / (Cw t) with the statical moment
of sectorial area S_w = h t (b^2/4 - x^2) / 4 of the flange beyond x, Cw = t b^3 h^2 / 24 (both
from memory). Doubly symmetric I, flange width b = 100, flange mid-lines h = 200 apart,
tw = 0.6 tf, t/b = 0.2 ... 0.025: the finite-element values must approach the formulas as
t/b -> 0.
"""

from __future__ import annotations

import numpy as np
from test_shear_centre_warping import T_OVER_B, check_approach, i_beam_outline, run

from warpwise.fem.p2 import gradient, integrate, interpolate
from warpwise.stress.warping import secondary_warping, warping_stress

B_, H, E = 100.0, 200.0, 210000.0
PHI2, TW = 1.0e-6, 1.0e5  # rad/mm2 and N*mm, any values (the stresses are linear in them)


def _section(tb):
    tf = tb * B_
    res = run(i_beam_outline(B_, H, tf, 0.6 * tf))
    return res, tf, warping_stress(res, -E * res.torsion.Cw * PHI2, TW, E)


def test_warping_normal_stress_of_an_i_section():
    # sigma_w = E omega phi'' at the flange tip, mid-thickness node nearest (b/2, h/2); the
    # flange's own through-thickness warping -x (y - h/2) (thin strip, common practice, no
    # source) is added to the sectorial coordinate x h / 2 for the node's own y.
    # Measured relative differences for t/b = 0.2, 0.1, 0.05, 0.025: -3.1e-3, -8.0e-4, -2.0e-4,
    # -1.4e-4 (slope about 1.9 before the mesh error of the thinnest takes over); bounds:
    # falling at every step, slope > 1.5, final below 1e-3
    diffs = []
    for tb in T_OVER_B:
        res, _tf, s = _section(tb)
        nodes = res.mesh.nodes
        k = int(np.argmin(np.hypot(nodes[:, 0] - B_ / 2, nodes[:, 1] - H / 2)))
        x, y = nodes[k]
        thin = E * x * (H - y) * PHI2
        diffs.append(abs(s.sigma[k]) / abs(thin) - 1.0)
    check_approach(T_OVER_B, diffs, 1.5, 1e-3)


def test_warping_shear_stress_of_an_i_section():
    # tau_w = T_w S_w / (Cw t) in the flange at the node nearest (b/4, h/2): converges to the
    # thin-walled value as t/b -> 0 (Cw and S_w of the thin-walled theory). Measured for
    # t/b = 0.2, 0.1, 0.05, 0.025: -1.2e-3, +9.5e-4, -1.9e-4, +7.8e-5 (the web-junction and
    # Cw terms of order t/b change sign on the way); bounds: final below 2e-4, below the first
    diffs = []
    for tb in T_OVER_B:
        res, tf, s = _section(tb)
        nodes = res.mesh.nodes
        k = int(np.argmin(np.hypot(nodes[:, 0] - B_ / 4, nodes[:, 1] - H / 2)))
        x = nodes[k, 0]
        cw_thin = tf * B_**3 * H**2 / 24.0
        thin = TW * H * (B_**2 / 4 - x * x) / (4.0 * cw_thin)
        diffs.append(s.tau[k] / thin - 1.0)
        # along the flange, across the web direction nearly nothing (thin-walled flow)
        assert abs(s.tau_zy[k]) < 0.01 * abs(s.tau_zx[k])
    assert abs(diffs[-1]) < 2e-4, diffs
    assert abs(diffs[-1]) < abs(diffs[0]), diffs


def test_warping_shear_carries_the_warping_torque():
    # int (x_s tau_zy - y_s tau_zx) dA = T_w about the shear centre, and no net shear force
    # (exact in the weak form, derivation in stress/warping.py; here with the element
    # gradients of chi, to round-off 1e-9 of the solve)
    res, _tf, _s = _section(0.1)
    chi = secondary_warping(res)
    ev = res.basis

    g = gradient(res.mesh, ev, chi) * (TW / res.torsion.Cw)
    xs = ev.xy[..., 0] - (res.torsion.shear_centre[0] - res.geometric.centroid[0])
    ys = ev.xy[..., 1] - (res.torsion.shear_centre[1] - res.geometric.centroid[1])
    torque = integrate(ev, xs * g[..., 1] - ys * g[..., 0])
    assert abs(torque / TW - 1.0) < 1e-9
    assert abs(integrate(ev, g[..., 0])) < 1e-9 * TW / H
    assert abs(integrate(ev, interpolate(res.mesh, ev, res.torsion.omega))) < 1e-9 * H**2 * B_ * 10
