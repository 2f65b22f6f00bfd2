/* test-cli.c: "arcwright-cli fly" end to end: the built program, its output formats and its
 * answers to bad input
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The program's path comes from the environment (AW_CLI, set by the build). Values are checked
 * against the physics reference (physics.md §5, §6) with the sources named beside each check.
 */
#include <glib.h>
#include <json-glib/json-glib.h>
#include <math.h>
#include <string.h>

#define EXIT_USAGE 2   /* aw-cli.h: bad input */

/* physics.md §5 regression trajectories: "Tolerance 1e-4 relative" (CALC) */
#define REGRESSION_RTOL 1e-4

/* The regression air of physics.md §5: ρ = 1.2, μ = 1.81e-5 */
#define REGRESSION_AIR "--density", "1.2", "--viscosity", "1.81e-5"

typedef struct
{
  int exit_code;
  char *out;
  char *err;
} CliResult;

static void
cli_result_clear (CliResult *r)
{
  g_clear_pointer (&r->out, g_free);
  g_clear_pointer (&r->err, g_free);
}

/* Runs "arcwright-cli fly ARGS…" (NULL-terminated) with LC_ALL=C */
static void
run_fly (CliResult *r, const char *first, ...)
{
  const char *cli = g_getenv ("AW_CLI");
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  g_autoptr (GError) error = NULL;
  g_auto (GStrv) envp = g_get_environ ();
  int wait_status = 0;
  va_list ap;

  if (cli == NULL)
    g_error ("AW_CLI is not set: run this test through meson");
  envp = g_environ_setenv (envp, "LC_ALL", "C", TRUE);
  g_ptr_array_add (argv, (char *) cli);
  g_ptr_array_add (argv, (char *) "fly");
  va_start (ap, first);
  for (const char *a = first; a != NULL; a = va_arg (ap, const char *))
    g_ptr_array_add (argv, (char *) a);
  va_end (ap);
  g_ptr_array_add (argv, NULL);

  memset (r, 0, sizeof *r);
  if (!g_spawn_sync (NULL, (char **) argv->pdata, envp, G_SPAWN_DEFAULT, NULL, NULL, &r->out,
                     &r->err, &wait_status, &error))
    g_error ("cannot run %s: %s", cli, error->message);
  if (g_spawn_check_wait_status (wait_status, &error))
    r->exit_code = 0;
  else if (error->domain == G_SPAWN_EXIT_ERROR)
    r->exit_code = error->code;
  else
    g_error ("%s did not exit normally: %s", cli, error->message);
}

static JsonObject *
parse_json (JsonParser *parser, const char *text)
{
  g_autoptr (GError) error = NULL;
  if (!json_parser_load_from_data (parser, text, -1, &error))
    g_error ("output is not JSON: %s\n%s", error->message, text);
  JsonNode *root = json_parser_get_root (parser);
  g_assert_nonnull (root);
  g_assert_true (JSON_NODE_HOLDS_OBJECT (root));
  return json_node_get_object (root);
}

static double
summary_number (JsonObject *root, const char *name)
{
  JsonObject *summary = json_object_get_object_member (root, "summary");
  g_assert_nonnull (summary);
  g_assert_true (json_object_has_member (summary, name));
  JsonNode *n = json_object_get_member (summary, name);
  /* a JSON number; one without a fraction ("0") reads as an integer */
  g_assert_true (JSON_NODE_HOLDS_VALUE (n));
  GType t = json_node_get_value_type (n);
  if (t != G_TYPE_DOUBLE && t != G_TYPE_INT64)
    g_error ("summary.%s is not a number", name);
  return json_node_get_double (n);
}

static void
test_json_regression (void)
{
  CliResult r;
  g_autoptr (JsonParser) parser = json_parser_new ();

  run_fly (&r, REGRESSION_AIR, "--spin-rpm", "4318.28", "--format", "json", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  g_assert_cmpstr (r.err, ==, "");
  JsonObject *root = parse_json (parser, r.out);

  /* physics.md §5 regression, backspin 4318.28 rpm (CALC) */
  double x = summary_number (root, "ground_distance_m");
  g_test_message ("ground %.6f m", x);
  g_assert_cmpfloat_with_epsilon (x / 38.0856, 1.0, REGRESSION_RTOL);
  g_assert_cmpfloat_with_epsilon (summary_number (root, "time_of_flight_s") / 0.92571, 1.0,
                                  REGRESSION_RTOL);
  g_assert_cmpfloat_with_epsilon (summary_number (root, "impact_spin_rpm") / 3683.0, 1.0,
                                  REGRESSION_RTOL);
  g_assert_cmpfloat_with_epsilon (summary_number (root, "muzzle_spin_rpm"), 4318.28, 1e-6);
  /* physics.md §5: 4318.28 rpm is lift = weight at launch (CALC, printed to 6 digits) */
  g_assert_cmpfloat_with_epsilon (summary_number (root, "muzzle_lift_ratio"), 1.0, 1e-6);
  /* level bore, lift = weight: it never climbs, so the apex is the muzzle */
  g_assert_cmpfloat (summary_number (root, "apex_height_m"), ==, 1.5);

  /* samples: every metre from the muzzle, then the impact */
  JsonArray *samples = json_object_get_array_member (root, "samples");
  g_assert_nonnull (samples);
  guint n = json_array_get_length (samples);
  g_assert_cmpuint (n, ==, (guint) floor (x) + 2);
  for (guint i = 0; i < n; i++)
    {
      JsonObject *s = json_array_get_object_element (samples, i);
      double sx = json_object_get_double_member (s, "x_m");
      if (i + 1 < n)
        g_assert_cmpfloat_with_epsilon (sx, (double) i, 1e-9);
      else
        {
          g_assert_cmpfloat_with_epsilon (sx, x, 1e-6);
          g_assert_cmpfloat (fabs (json_object_get_double_member (s, "z_m")), <, 1e-9);
        }
      if (i == 30)   /* physics.md §5: z(x = 30 m) = 0.92962 m (CALC) */
        g_assert_cmpfloat_with_epsilon (json_object_get_double_member (s, "z_m") / 0.92962, 1.0,
                                        REGRESSION_RTOL);
    }
  JsonObject *first = json_array_get_object_element (samples, 0);
  g_assert_cmpfloat (json_object_get_double_member (first, "z_m"), ==, 1.5);
  g_assert_cmpfloat (json_object_get_double_member (first, "speed_mps"), ==, 90.0);
  /* trade.md: E = ½mv²; 0.20 g at 90 m/s = 0.81 J */
  g_assert_cmpfloat_with_epsilon (json_object_get_double_member (first, "energy_j"), 0.81, 1e-9);
  cli_result_clear (&r);
}

static void
test_json_lift_ratio (void)
{
  CliResult r;
  g_autoptr (JsonParser) parser = json_parser_new ();

  run_fly (&r, REGRESSION_AIR, "--lift-ratio", "1", "--format", "json", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  JsonObject *root = parse_json (parser, r.out);
  g_assert_cmpfloat (summary_number (root, "muzzle_lift_ratio"), ==, 1.0);
  /* physics.md §6: lift = weight with S/(1+2S), 0.20 g at 90 m/s, ρ 1.2 → 4 318 rpm (CALC) */
  g_assert_cmpfloat_with_epsilon (summary_number (root, "muzzle_spin_rpm"), 4318.0, 1.0);
  /* and hence the §5 regression flight (CALC) */
  g_assert_cmpfloat_with_epsilon (summary_number (root, "ground_distance_m") / 38.0856, 1.0,
                                  REGRESSION_RTOL);
  cli_result_clear (&r);

  /* the trade preset: about 130 000 rpm for lift ratio 1 (common practice, no source; ±5 %) */
  g_autoptr (JsonParser) parser2 = json_parser_new ();
  run_fly (&r, REGRESSION_AIR, "--lift", "trade", "--lift-ratio", "1", "--format", "json", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  root = parse_json (parser2, r.out);
  g_assert_cmpfloat_with_epsilon (summary_number (root, "muzzle_spin_rpm") / 130000.0, 1.0, 0.05);
  /* the lift ratio, not the spin, fixes the flight: same ground distance as above (physics.md
   * design decision 1: k·ω is what counts for linear models; S/(1+2S) is nearly linear at
   * S = 0.015, so the flights agree to a few cm) */
  g_assert_cmpfloat_with_epsilon (summary_number (root, "ground_distance_m"), 38.0856, 0.5);
  cli_result_clear (&r);
}

static void
test_csv (void)
{
  CliResult r;

  run_fly (&r, REGRESSION_AIR, "--spin-rpm", "4318.28", "--step-m", "5", "--format", "csv", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  g_assert_cmpstr (r.err, ==, "");
  g_assert_true (g_str_has_suffix (r.out, "\r\n"));
  g_auto (GStrv) lines = g_strsplit (r.out, "\r\n", -1);
  g_assert_cmpstr (lines[0], ==, "t_s,x_m,y_m,z_m,speed_mps,spin_rpm,energy_j");
  guint n = g_strv_length (lines);
  /* header, x = 0, 5, …, 35, the impact, and the empty string after the last CRLF */
  g_assert_cmpuint (n, ==, 1 + 8 + 1 + 1);
  g_assert_cmpstr (lines[n - 1], ==, "");
  for (guint i = 1; i + 1 < n; i++)
    {
      g_auto (GStrv) f = g_strsplit (lines[i], ",", -1);
      g_assert_cmpuint (g_strv_length (f), ==, 7);
      for (guint k = 0; k < 7; k++)
        {
          char *end = NULL;
          double v = g_ascii_strtod (f[k], &end);
          g_assert_true (end != f[k] && *end == '\0' && isfinite (v));
        }
      double x = g_ascii_strtod (f[1], NULL);
      if (i + 2 < n)
        g_assert_cmpfloat_with_epsilon (x, 5.0 * (i - 1), 1e-9);
      else   /* physics.md §5 regression, backspin: ground at 38.0856 m (CALC) */
        g_assert_cmpfloat_with_epsilon (x / 38.0856, 1.0, REGRESSION_RTOL);
    }
  cli_result_clear (&r);
}

static void
test_text (void)
{
  CliResult r;

  run_fly (&r, REGRESSION_AIR, "--spin-rpm", "4318.28", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  g_assert_cmpstr (r.err, ==, "");
  /* physics.md §5 regression (CALC), as printed to 2 decimals */
  g_assert_nonnull (strstr (r.out, "ground distance 38.09 m"));
  cli_result_clear (&r);

  run_fly (&r, "--help", NULL);
  g_assert_cmpint (r.exit_code, ==, 0);
  g_assert_nonnull (strstr (r.out, "--lift-ratio"));
  cli_result_clear (&r);
}

/* Values at the edges of the accepted ranges are accepted by the front end and by the engine */
static void
test_edges_accepted (void)
{
  static const char *const cases[][4] = {
    { "--elevation-deg", "90", "--hop-tilt-deg", "90" },
    { "--elevation-deg", "-90", "--hop-tilt-deg", "-90" },
    { "--spin-rpm", "950000", "--velocity-mps", "300" },
    { "--mass-g", "5", "--diameter-mm", "20" },
    { "--mass-g", "0.01", "--diameter-mm", "1" },
    { "--temperature-c", "60", "--humidity-pct", "100" },
    { "--altitude-m", "6000", "--temperature-c", "-40" },
    { "--pressure-hpa", "500", "--gravity", "30" },
    { "--crosswind-mps", "-50", "--height-m", "100" },
    { "--lift-ratio", "20", "--velocity-mps", "300" },
  };
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      CliResult r;
      run_fly (&r, cases[i][0], cases[i][1], cases[i][2], cases[i][3], "--format", "json",
               "--step-m", "1000", NULL);
      g_test_message ("%s %s %s %s: exit %d %s", cases[i][0], cases[i][1], cases[i][2],
                      cases[i][3], r.exit_code, r.err);
      g_assert_cmpint (r.exit_code, ==, 0);
      g_autoptr (JsonParser) parser = json_parser_new ();
      JsonObject *root = parse_json (parser, r.out);
      g_assert_true (isfinite (summary_number (root, "time_of_flight_s")));
      cli_result_clear (&r);
    }
}

/* aw-cli.h: bad input exits with 2 and one clear line on stderr naming the option */
typedef struct
{
  const char *args[5];
  const char *names[2];   /* what the message must mention */
} BadCase;

static const BadCase bad_cases[] = {
  { { "--bogus", "1" }, { "--bogus" } },                              /* unknown option */
  { { "--mass-g", "abc" }, { "--mass-g" } },                          /* non-numeric */
  { { "--mass-g=abc" }, { "--mass-g" } },
  { { "--mass-g", "nan" }, { "--mass-g" } },
  { { "--velocity-mps", "inf" }, { "--velocity-mps" } },
  { { "--mass-g", "1e400" }, { "--mass-g" } },                        /* overflows a double */
  { { "--mass-g", "-0.2" }, { "--mass-g" } },                         /* negative mass */
  { { "--velocity-mps", "0" }, { "--velocity-mps" } },                /* zero velocity */
  { { "--diameter-mm", "0" }, { "--diameter-mm" } },                  /* zero diameter */
  { { "--mass-g", "10" }, { "--mass-g" } },                           /* out of range */
  { { "--diameter-mm", "25" }, { "--diameter-mm" } },
  { { "--velocity-mps", "301" }, { "--velocity-mps" } },
  { { "--velocity-fps", "2000" }, { "--velocity-fps" } },
  { { "--energy-j", "50" }, { "--energy-j" } },                       /* 707 m/s with 0.20 g */
  { { "--energy-j", "0" }, { "--energy-j" } },
  { { "--elevation-deg", "95" }, { "--elevation-deg" } },
  { { "--hop-tilt-deg", "-91" }, { "--hop-tilt-deg" } },
  { { "--height-m", "-1" }, { "--height-m" } },
  { { "--crosswind-mps", "80" }, { "--crosswind-mps" } },
  { { "--temperature-c", "-60" }, { "--temperature-c" } },
  { { "--pressure-hpa", "2000" }, { "--pressure-hpa" } },
  { { "--altitude-m", "9000" }, { "--altitude-m" } },
  { { "--humidity-pct", "120" }, { "--humidity-pct" } },
  { { "--density", "3" }, { "--density" } },
  { { "--viscosity", "1" }, { "--viscosity" } },
  { { "--gravity", "0" }, { "--gravity" } },
  { { "--spin-rpm", "1e7" }, { "--spin-rpm" } },
  { { "--lift-ratio", "30" }, { "--lift-ratio" } },
  { { "--lift-ratio", "-1" }, { "--lift-ratio" } },
  { { "--step-m", "0.001" }, { "--step-m" } },
  { { "--step-m", "0" }, { "--step-m" } },
  { { "--drag", "foo" }, { "--drag" } },                              /* bad --drag */
  { { "--drag", "const:-1" }, { "--drag" } },
  { { "--drag", "const:nan" }, { "--drag" } },
  { { "--lift", "magic" }, { "--lift" } },                            /* bad --lift */
  { { "--lift", "linear:abc" }, { "--lift" } },
  { { "--lift", "linear:0" }, { "--lift" } },
  { { "--format", "xml" }, { "--format" } },                          /* bad --format */
  { { "--format", "" }, { "--format" } },
  { { "--velocity-mps", "90", "--energy-j", "1" }, { "--velocity-mps", "--energy-j" } },
  { { "--velocity-fps", "330", "--velocity-mps", "90" }, { "--velocity-mps", "--velocity-fps" } },
  { { "--spin-rpm", "1000", "--lift-ratio", "1" }, { "--spin-rpm", "--lift-ratio" } },
  { { "--pressure-hpa", "1000", "--altitude-m", "500" }, { "--pressure-hpa", "--altitude-m" } },
  { { "--lift", "off", "--lift-ratio", "1" }, { "--lift-ratio" } },    /* no lift to give */
  { { "--velocity-mps", "40", "--lift-ratio", "19" }, { "--lift-ratio" } },  /* saturates */
  { { "--mass-g" }, { "--mass-g" } },                                 /* missing value */
  { { "--mass-g", "" }, { "--mass-g" } },
  { { "--help=1" }, { "--help" } },
  { { "-x" }, { "-x" } },
  { { "stray" }, { "stray" } },                                       /* a stray argument */
};

static void
test_bad_input (void)
{
  for (guint i = 0; i < G_N_ELEMENTS (bad_cases); i++)
    {
      const BadCase *c = &bad_cases[i];
      CliResult r;
      run_fly (&r, c->args[0], c->args[1], c->args[2], c->args[3], c->args[4], NULL);
      g_test_message ("%s %s %s %s -> exit %d: %s", c->args[0], c->args[1] ? c->args[1] : "",
                      c->args[2] ? c->args[2] : "", c->args[3] ? c->args[3] : "", r.exit_code,
                      r.err);
      g_assert_cmpint (r.exit_code, ==, EXIT_USAGE);
      g_assert_cmpstr (r.out, ==, "");
      /* exactly one line */
      g_assert_true (g_str_has_suffix (r.err, "\n"));
      g_assert_true (strchr (r.err, '\n') == r.err + strlen (r.err) - 1);
      g_assert_true (g_str_has_prefix (r.err, "arcwright-cli fly: "));
      for (guint k = 0; k < G_N_ELEMENTS (c->names) && c->names[k]; k++)
        g_assert_nonnull (strstr (r.err, c->names[k]));
      cli_result_clear (&r);
    }
}

int
main (int argc, char **argv)
{
  g_test_init (&argc, &argv, NULL);

  g_test_add_func ("/cli/fly/json-regression", test_json_regression);
  g_test_add_func ("/cli/fly/json-lift-ratio", test_json_lift_ratio);
  g_test_add_func ("/cli/fly/csv", test_csv);
  g_test_add_func ("/cli/fly/text", test_text);
  g_test_add_func ("/cli/fly/edges-accepted", test_edges_accepted);
  g_test_add_func ("/cli/fly/bad-input", test_bad_input);

  return g_test_run ();
}
