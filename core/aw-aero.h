/* aw-aero.h: drag, Magnus lift and spin-decay models of a smooth 6 mm sphere
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libm only. Each model is selectable; see the physics reference §2–§4 and DEVELOPERS.md
 * ("Adding a drag or lift model").
 */
#pragma once

#ifdef __cplusplus
extern "C" {
#endif

typedef enum
{
  AW_DRAG_CLIFT = 0,      /* Clift, Grace & Weber 1978, Table 5.2 (default) */
  AW_DRAG_MORRISON,       /* Morrison 2013 */
  AW_DRAG_CONSTANT,       /* constant C_D */
  AW_DRAG_OFF,
  AW_N_DRAG_MODELS
} AwDragModel;

typedef enum
{
  AW_LIFT_SATURATING = 0, /* C_L = S/(1+2S) (default) */
  AW_LIFT_SHS,            /* Sawicki, Hubbard & Stronge 2003: 1.5S, S ≤ 0.1; 0.09 + 0.6S above */
  AW_LIFT_LOTH,           /* Loth 2008, smooth sphere, Re → ∞: 0.5S */
  AW_LIFT_LINEAR,         /* k·S, k user-given */
  AW_LIFT_OFF,
  AW_N_LIFT_MODELS
} AwLiftModel;

/* The trade-matched linear slope: about 130 000 rpm holds 0.20 g level at 90 m/s
 * (common practice, no source; physics reference §6). */
#define AW_LIFT_TRADE_SLOPE 0.032

#define AW_SPIN_DECAY_CM_DEFAULT   0.02   /* c_M of T = c_M·S·q·A·r (physics reference §4b) */
#define AW_INERTIA_FACTOR_DEFAULT  0.4    /* κ of I = κ·m·r², homogeneous solid sphere */

typedef struct
{
  AwDragModel drag;
  double drag_cd;            /* C_D for AW_DRAG_CONSTANT */
  AwLiftModel lift;
  double lift_slope;         /* k for AW_LIFT_LINEAR */
  double spin_decay_cm;      /* c_M */
  double inertia_factor;     /* κ */
  double lift_factor;        /* calibration multipliers, 1.0 by default */
  double drag_factor;
  double spin_decay_factor;
} AwAeroModel;

/* Defaults: Clift drag, S/(1+2S) lift, c_M = 0.02, κ = 0.4, all factors 1. */
void aw_aero_model_init (AwAeroModel *model);

/* C_D of a smooth non-spinning sphere at Reynolds number re (> 0). */
double aw_drag_clift (double re);
double aw_drag_morrison (double re);
double aw_aero_drag_coefficient (const AwAeroModel *model, double re);

/* C_L at spin parameter s (≥ 0), without the calibration factor. */
double aw_aero_lift_coefficient (const AwAeroModel *model, double s);

/* Inverse of aw_aero_lift_coefficient: the S giving C_L = cl (without the calibration factor).
 * Returns a negative value when no S reaches cl (a saturating model, or lift off). */
double aw_aero_spin_parameter_for_lift (const AwAeroModel *model, double cl);

/* Largest C_L the model can give (INFINITY for unbounded models, 0 when off). */
double aw_aero_lift_coefficient_max (const AwAeroModel *model);

#ifdef __cplusplus
}
#endif
