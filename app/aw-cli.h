/* aw-cli.h: shared pieces of the arcwright-cli front end
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every subcommand lives in its own aw-cli-NAME.c and is listed in aw-cli.c. Exit codes:
 * 0 success, 1 the work itself failed (I/O, a flight that could not be computed), 2 bad input
 * (unknown option, bad value, invalid file), with one clear line on stderr naming the option.
 */
#pragma once

#include <glib.h>
#include <stdbool.h>

#include "aw-flight.h"
#include "aw-project.h"

G_BEGIN_DECLS

#define AW_CLI_EXIT_OK      0
#define AW_CLI_EXIT_FAILED  1
#define AW_CLI_EXIT_USAGE   2

typedef enum
{
  AW_CLI_ARG_FLAG,      /* no value; *(bool *) target = true */
  AW_CLI_ARG_DOUBLE,    /* finite number, *(double *) target; lo ≤ v ≤ hi */
  AW_CLI_ARG_POSITIVE,  /* finite number > 0 and ≤ hi */
  AW_CLI_ARG_STRING,    /* *(const char **) target */
  AW_CLI_ARG_STRINGS,   /* appended to a (GPtrArray *) target, may repeat */
  AW_CLI_ARG_CHOICE,    /* one word of choices (NULL-terminated); *(int *) target = its index */
} AwCliArgKind;

typedef struct
{
  const char *name;     /* without the leading "--" */
  AwCliArgKind kind;
  void *target;
  double lo, hi;        /* range for numbers */
  bool *seen;           /* optional: set when the option is given */
  const char *const *choices;  /* AW_CLI_ARG_CHOICE: the words accepted */
} AwCliArg;

/* Words for the common --format choices; index order is the AwCliFormat order. */
typedef enum { AW_CLI_FORMAT_TEXT, AW_CLI_FORMAT_CSV, AW_CLI_FORMAT_JSON } AwCliFormat;
extern const char *const aw_cli_format_words[];

/* Appends one option to a GArray of AwCliArg. */
#define AW_CLI_ADD(args, n, k, t, l, h, s) \
  g_array_append_val (args, ((AwCliArg) { n, k, t, l, h, s, NULL }))
#define AW_CLI_ADD_CHOICE(args, n, t, words, s) \
  g_array_append_val (args, ((AwCliArg) { n, AW_CLI_ARG_CHOICE, t, 0, 0, s, words }))

/* Parses argv[first..argc) against args (terminated by a {NULL} entry). Positional arguments are
 * appended to positionals when it is non-NULL, else they are an error. On error prints one line
 * "arcwright-cli: --NAME: problem" to stderr and returns false. */
bool aw_cli_parse (int argc, char **argv, int first, const AwCliArg *args, GPtrArray *positionals,
                   const char *command);

/* Prints "arcwright-cli COMMAND: message" to stderr. */
void aw_cli_error (const char *command, const char *format, ...) G_GNUC_PRINTF (2, 3);

/* Shot options shared by fly and table (the contract of the fly command). */
typedef struct
{
  double mass_g, diameter_mm;
  double velocity_mps, velocity_fps, energy_j;
  double spin_rpm, lift_ratio, hop_tilt_deg;
  double height_m, elevation_deg, crosswind_mps;
  double temperature_c, pressure_hpa, altitude_m, humidity_pct;
  double density, viscosity, gravity;
  const char *drag, *lift;
  bool seen_mass, seen_diameter, seen_velocity_mps, seen_velocity_fps, seen_energy;
  bool seen_spin, seen_lift_ratio, seen_tilt, seen_height, seen_elevation, seen_crosswind;
  bool seen_temperature, seen_pressure, seen_altitude, seen_humidity, seen_density;
  bool seen_viscosity, seen_gravity, seen_drag, seen_lift;
} AwCliShotOptions;

void aw_cli_shot_options_init (AwCliShotOptions *o);

/* Appends the shot options' table entries to args (a GArray of AwCliArg). */
void aw_cli_shot_options_add (AwCliShotOptions *o, GArray *args);

/* Applies the options that were given onto shot (which holds defaults or a stored setup).
 * hop_lift_ratio receives the lift ratio when --lift-ratio was given (NAN otherwise).
 * Returns false after printing one line naming the option on error. */
bool aw_cli_shot_options_apply (const AwCliShotOptions *o, AwShot *shot, double *hop_lift_ratio,
                                const char *command);

/* Parses a --drag or --lift value into the model; false when it is not understood. */
bool aw_cli_parse_drag (const char *s, AwAeroModel *model);
bool aw_cli_parse_lift (const char *s, AwAeroModel *model);

/* Formats a number for machine-readable output ("%.*g", locale-independent, no "-0"). */
char *aw_cli_num (char *buf, size_t len, double v, int digits);

/* Subcommands. */
int aw_cli_fly (int argc, char **argv);
int aw_cli_check (int argc, char **argv);
/* card, sheet and loadout (built with the GUI: AW_HAVE_PRINT) */
int aw_cli_print (int argc, char **argv);

/* Loads FILE (lenient: other bad setups do not matter) and finds the setup by name. On failure
 * prints clear lines on stderr ("arcwright-cli COMMAND: …", the problems of that setup, or the
 * names available) and returns false: the caller exits with AW_CLI_EXIT_USAGE. On success the
 * caller owns *project (free with aw_project_free); *setup points into it. */
bool aw_cli_load_setup (const char *file, const char *setup_name, const char *command,
                        AwProject **project, AwSetup **setup);
int aw_cli_sweep (int argc, char **argv);
int aw_cli_table (int argc, char **argv);
int aw_cli_recommend (int argc, char **argv);

G_END_DECLS
