/* aw-units.h: unit conversions
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * 1 ft = 0.3048 m exactly (international foot, 1959); 1 yd = 3 ft; 1 inHg = 3386.389 Pa
 * (conventional, NIST SP 811 appendix B); 1 MOA = 1/60 degree = π/10 800 rad.
 */
#pragma once

#ifdef __cplusplus
extern "C" {
#endif

#define AW_M_PER_FT    0.3048
#define AW_M_PER_YD    0.9144
#define AW_PA_PER_INHG 3386.389
#define AW_PI          3.14159265358979323846

static inline double aw_fps_to_mps (double fps) { return fps * AW_M_PER_FT; }
static inline double aw_mps_to_fps (double mps) { return mps / AW_M_PER_FT; }
static inline double aw_ft_to_m (double ft) { return ft * AW_M_PER_FT; }
static inline double aw_m_to_ft (double m) { return m / AW_M_PER_FT; }
static inline double aw_yd_to_m (double yd) { return yd * AW_M_PER_YD; }
static inline double aw_m_to_yd (double m) { return m / AW_M_PER_YD; }
static inline double aw_g_to_kg (double g) { return g * 1e-3; }
static inline double aw_kg_to_g (double kg) { return kg * 1e3; }
static inline double aw_mm_to_m (double mm) { return mm * 1e-3; }
static inline double aw_m_to_mm (double m) { return m * 1e3; }
static inline double aw_c_to_k (double c) { return c + 273.15; }
static inline double aw_k_to_c (double k) { return k - 273.15; }
static inline double aw_f_to_c (double f) { return (f - 32.0) * 5.0 / 9.0; }
static inline double aw_c_to_f (double c) { return c * 9.0 / 5.0 + 32.0; }
static inline double aw_hpa_to_pa (double hpa) { return hpa * 100.0; }
static inline double aw_pa_to_hpa (double pa) { return pa / 100.0; }
static inline double aw_inhg_to_hpa (double inhg) { return inhg * AW_PA_PER_INHG / 100.0; }
static inline double aw_hpa_to_inhg (double hpa) { return hpa * 100.0 / AW_PA_PER_INHG; }
static inline double aw_rpm_to_rad_s (double rpm) { return rpm * 2.0 * AW_PI / 60.0; }
static inline double aw_rad_s_to_rpm (double w) { return w * 60.0 / (2.0 * AW_PI); }
static inline double aw_deg_to_rad (double d) { return d * AW_PI / 180.0; }
static inline double aw_rad_to_deg (double r) { return r * 180.0 / AW_PI; }
static inline double aw_rad_to_mrad (double r) { return r * 1e3; }
static inline double aw_mrad_to_rad (double m) { return m * 1e-3; }
static inline double aw_rad_to_moa (double r) { return r * 10800.0 / AW_PI; }
static inline double aw_moa_to_rad (double moa) { return moa * AW_PI / 10800.0; }

/* Kinetic energy ½·m·v², m in kg, v in m/s, J. */
static inline double aw_energy_j (double mass_kg, double v_mps) { return 0.5 * mass_kg * v_mps * v_mps; }
/* Speed for an energy. */
double aw_velocity_for_energy (double mass_kg, double energy_j);

#ifdef __cplusplus
}
#endif
