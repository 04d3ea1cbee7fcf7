"""The report's closed-loop table for one supply: per mode the duty points its motors run at, the
pump stroke, high and low side, loop flow, pump input torque and power (negative: the load drives
the prime mover), charge flow against its need, transmission efficiency and heat. The relations
are stated once above the table; every figure is a Results value, formatted, nothing recomputed."""

from __future__ import annotations

from specgen.present.closed_loop import LOOP_COLUMNS, cells, duty_points, loop_modes

RELATIONS = ("x = q_loop / (Vp * n_p * eta_v,p) driving, q_loop * eta_v,p / (Vp * n_p) overrunning; "
             "T_loop = x * Vp * (p_H - p_L) / (2*pi * eta_hm,p) driving, -x * Vp * (p_H - p_L) * eta_hm,p / (2*pi) "
             "overrunning; P_in = P_loop + P_c; q_c,need = sum(V * n * (1 - eta_v)) + q_flush; "
             "Q = P_in - P_shaft + P_brake")


def loop_table(o, sup, system: str) -> dict | None:
    """The table for ``sup`` (None unless it is a closed loop that runs in some mode)."""
    modes = loop_modes(o, sup.id)
    if not modes:
        return None
    return {"relations": RELATIONS,
            "head": [{"label": h, "symbol": s} for _, h, s in LOOP_COLUMNS],
            "rows": [{"mode": r.mode, "duties": duty_points(r), "cells": cells(r, system)} for r in modes]}
