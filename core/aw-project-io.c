/* aw-project-io.c: reading, validating and writing project files
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Reading has three steps:
 *   1. a scan of the raw text (UTF-8, nesting depth, number literals out of range, duplicate
 *      member names, "\u0000"), because json-glib 1.6 recurses once per nesting level (a deeply
 *      nested file overflows the stack), keeps the last of two equal member names, wraps
 *      integers beyond 64 bits and reads 1e999 as infinity — each of which would lose data
 *      silently or crash;
 *   2. json-glib builds the tree;
 *   3. the tree is validated member by member into the model, collecting every problem with
 *      its JSON path.
 * Writing builds the text itself (numbers in the shortest round-trip form, locale-independent).
 */
#include "aw-config.h"

#include <errno.h>
#include <fcntl.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include <glib/gstdio.h>

#include "aw-project-io.h"
#include "aw-project-private.h"

#define MAX_FILE_BYTES   (512u * 1024u * 1024u)
#define MAX_NAME_CHARS   200
#define MAX_TEXT_CHARS   1000000
#define MAX_POINTS       100
#define MAX_SHOTS        10000

/* ------------------------------------------------------------------------------------------ */
/* numbers as text                                                                             */

/* Shortest text that reads back to the same double; plain notation for ordinary magnitudes. */
static void
format_number (char *buf, gsize len, double v)
{
  if (isnan (v))
    {
      g_strlcpy (buf, "nan", len);
      return;
    }
  if (isinf (v))
    {
      g_strlcpy (buf, v > 0 ? "inf" : "-inf", len);
      return;
    }
  double a = fabs (v);
  bool plain = a == 0.0 || (a >= 1e-5 && a < 1e16);
  for (int p = 1; p <= 17; p++)
    {
      char f[8];
      g_snprintf (f, sizeof f, "%%.%dg", p);
      g_ascii_formatd (buf, len, f, v);
      if (plain && strchr (buf, 'e') != NULL)
        continue;
      if (g_ascii_strtod (buf, NULL) == v)
        return;
    }
  g_ascii_formatd (buf, len, "%.17g", v);
}

/* ------------------------------------------------------------------------------------------ */
/* problems                                                                                    */

typedef struct
{
  GPtrArray *problems;      /* char*, owned by the caller or by the context */
  guint count;              /* problems found */
  guint fatal;              /* problems outside entries of setups / site_rules */
  GError *error;            /* the first fatal condition's code (syntax, version, io) */
} Ctx;

static void
problem_add (Ctx *ctx, const char *path, const char *fmt, ...) G_GNUC_PRINTF (3, 4);

static void
problem_add (Ctx *ctx, const char *path, const char *fmt, ...)
{
  va_list ap;
  va_start (ap, fmt);
  char *msg = g_strdup_vprintf (fmt, ap);
  va_end (ap);
  char *line = (path != NULL && *path) ? g_strdup_printf ("%s: %s", path, msg)
                                       : g_strdup (msg);
  g_free (msg);
  g_ptr_array_add (ctx->problems, line);
  ctx->count++;
}

/* A problem at member `key` of `path`; the joined path is only built when there is a problem. */
static void
problem_add_at (Ctx *ctx, const char *path, const char *key, const char *fmt, ...)
  G_GNUC_PRINTF (4, 5);

static void
problem_add_at (Ctx *ctx, const char *path, const char *key, const char *fmt, ...)
{
  va_list ap;
  va_start (ap, fmt);
  char *msg = g_strdup_vprintf (fmt, ap);
  va_end (ap);
  char *line = (path != NULL && *path) ? g_strdup_printf ("%s.%s: %s", path, key, msg)
                                       : g_strdup_printf ("%s: %s", key, msg);
  g_free (msg);
  g_ptr_array_add (ctx->problems, line);
  ctx->count++;
}

static char *
path_member (const char *path, const char *key)
{
  return (path == NULL || *path == '\0') ? g_strdup (key) : g_strdup_printf ("%s.%s", path, key);
}

static char *
path_index (const char *path, guint i)
{
  return g_strdup_printf ("%s[%u]", path, i);
}

static const char *
node_kind (JsonNode *node)
{
  switch (json_node_get_node_type (node))
    {
    case JSON_NODE_OBJECT:
      return "an object";
    case JSON_NODE_ARRAY:
      return "an array";
    case JSON_NODE_NULL:
      return "null";
    case JSON_NODE_VALUE:
    default:
      {
        GType t = json_node_get_value_type (node);
        if (t == G_TYPE_STRING)
          return "a string";
        if (t == G_TYPE_BOOLEAN)
          return json_node_get_boolean (node) ? "true" : "false";
        return "a number";
      }
    }
}

/* A string shown in a problem: quoted, cut to 40 characters. */
static char *
quote_for_problem (const char *s)
{
  GString *out = g_string_new ("\"");
  guint n = 0;
  for (const char *p = s; *p && n < 40; p = g_utf8_next_char (p), n++)
    {
      gunichar c = g_utf8_get_char (p);
      if (c == '"' || c == '\\')
        g_string_append_printf (out, "\\%c", (char) c);
      else if (c < 0x20)
        g_string_append_printf (out, "\\u%04x", c);
      else
        g_string_append_unichar (out, c);
    }
  if (g_utf8_strlen (s, -1) > 40)
    g_string_append (out, "…");
  g_string_append_c (out, '"');
  return g_string_free (out, FALSE);
}

/* ------------------------------------------------------------------------------------------ */
/* 1. scan of the raw text                                                                     */

typedef struct
{
  const char *data;
  gsize len;
  gsize pos;
  guint line;
  guint col;        /* 1-based, in characters */
} Scan;

static void
scan_advance (Scan *s)
{
  unsigned char c = (unsigned char) s->data[s->pos++];
  if (c == '\n')
    {
      s->line++;
      s->col = 1;
    }
  else if ((c & 0xC0) != 0x80)
    s->col++;
}

/* Returns FALSE after a syntax-level problem (the parse is not attempted). Duplicate member
 * names and out-of-range numbers are collected and scanning goes on. */
static gboolean
prescan (Ctx *ctx, const char *data, gsize len)
{
  const char *bad_utf8 = NULL;
  if (!g_utf8_validate (data, (gssize) len, &bad_utf8))
    {
      Scan s = { data, len, 0, 1, 1 };
      while (s.data + s.pos < bad_utf8)
        scan_advance (&s);
      if (bad_utf8 < data + len && *bad_utf8 == '\0')
        problem_add (ctx, NULL, "line %u, column %u: syntax error: NUL byte in the text",
                     s.line, s.col);
      else
        problem_add (ctx, NULL, "line %u, column %u: syntax error: the text is not valid UTF-8",
                     s.line, s.col);
      ctx->fatal++;
      g_set_error_literal (&ctx->error, AW_CORE_ERROR, AW_CORE_ERROR_SYNTAX, "");
      return FALSE;
    }

  Scan s = { data, len, 0, 1, 1 };
  /* per open container: is it an object, and the member names seen in it */
  gboolean is_object[AW_PROJECT_MAX_DEPTH + 1];
  gboolean expect_key[AW_PROJECT_MAX_DEPTH + 1];
  GHashTable *keys[AW_PROJECT_MAX_DEPTH + 1] = { NULL };
  int depth = 0;
  gboolean ok = TRUE;

  while (s.pos < len)
    {
      char c = data[s.pos];
      if (c == '[' || c == '{')
        {
          if (depth >= AW_PROJECT_MAX_DEPTH)
            {
              problem_add (ctx, NULL,
                           "line %u, column %u: syntax error: nesting deeper than %d levels",
                           s.line, s.col, AW_PROJECT_MAX_DEPTH);
              ok = FALSE;
              break;
            }
          depth++;
          is_object[depth] = c == '{';
          expect_key[depth] = c == '{';
          if (c == '{')
            {
              if (keys[depth] == NULL)
                keys[depth] = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
              else
                g_hash_table_remove_all (keys[depth]);
            }
          scan_advance (&s);
        }
      else if (c == ']' || c == '}')
        {
          if (depth > 0)
            depth--;
          scan_advance (&s);
        }
      else if (c == ',')
        {
          if (depth > 0 && is_object[depth])
            expect_key[depth] = TRUE;
          scan_advance (&s);
        }
      else if (c == ':')
        {
          if (depth > 0)
            expect_key[depth] = FALSE;
          scan_advance (&s);
        }
      else if (c == '"')
        {
          guint line = s.line, col = s.col;
          gsize start = s.pos + 1;
          scan_advance (&s);
          gboolean closed = FALSE;
          while (s.pos < len)
            {
              char d = data[s.pos];
              if (d == '\\')
                {
                  guint esc_col = s.col;
                  scan_advance (&s);
                  if (s.pos < len && data[s.pos] == 'u' && s.pos + 5 <= len
                      && strncmp (data + s.pos + 1, "0000", 4) == 0)
                    {
                      problem_add (ctx, NULL,
                                   "line %u, column %u: \\u0000 (a NUL character) is not "
                                   "allowed in strings", s.line, esc_col);
                      ctx->fatal++;
                    }
                  if (s.pos < len)
                    scan_advance (&s);
                  continue;
                }
              if (d == '"')
                {
                  closed = TRUE;
                  break;
                }
              scan_advance (&s);
            }
          if (!closed)
            break;   /* json-glib reports the unterminated string */
          if (depth > 0 && is_object[depth] && expect_key[depth])
            {
              char *key = g_strndup (data + start, s.pos - start);
              if (!g_hash_table_add (keys[depth], key))
                {
                  char *q = quote_for_problem (key);
                  problem_add (ctx, NULL,
                               "line %u, column %u: member %s appears more than once in the "
                               "same object", line, col, q);
                  g_free (q);
                  ctx->fatal++;
                }
            }
          scan_advance (&s);   /* closing quote */
        }
      else if (c == '-' || (c >= '0' && c <= '9'))
        {
          guint line = s.line, col = s.col;
          gsize start = s.pos;
          gboolean integer = TRUE;
          while (s.pos < len && strchr ("+-0123456789.eE", data[s.pos]) != NULL)
            {
              if (strchr (".eE", data[s.pos]) != NULL)
                integer = FALSE;
              scan_advance (&s);
            }
          char *text = g_strndup (data + start, s.pos - start);
          gboolean bad = FALSE;
          if (integer)
            {
              errno = 0;
              g_ascii_strtoll (text, NULL, 10);
              bad = errno == ERANGE;
            }
          else
            bad = !isfinite (g_ascii_strtod (text, NULL));
          if (bad)
            {
              if (strlen (text) > 40)
                strcpy (text + 37, "...");
              problem_add (ctx, NULL, "line %u, column %u: number %s is out of range",
                           line, col, text);
              ctx->fatal++;
            }
          g_free (text);
        }
      else
        scan_advance (&s);
    }

  for (int i = 0; i <= AW_PROJECT_MAX_DEPTH; i++)
    if (keys[i] != NULL)
      g_hash_table_unref (keys[i]);
  if (!ok)
    {
      ctx->fatal++;
      g_set_error_literal (&ctx->error, AW_CORE_ERROR, AW_CORE_ERROR_SYNTAX, "");
    }
  return ok;
}

/* "<data>:3:12: Parse error: unexpected …" → "line 3, column 12: syntax error: unexpected …" */
static char *
syntax_message (const char *msg)
{
  const char *p = msg;
  if (g_str_has_prefix (p, "<data>:"))
    p += strlen ("<data>:");
  char *end = NULL;
  guint64 line = g_ascii_strtoull (p, &end, 10);
  if (end != p && *end == ':')
    {
      const char *q = end + 1;
      guint64 col = g_ascii_strtoull (q, &end, 10);
      if (end != q && *end == ':')
        {
          const char *rest = end + 1;
          while (*rest == ' ')
            rest++;
          if (g_str_has_prefix (rest, "Parse error: "))
            rest += strlen ("Parse error: ");
          return g_strdup_printf ("line %" G_GUINT64_FORMAT ", column %" G_GUINT64_FORMAT
                                  ": syntax error: %s", line, col, rest);
        }
    }
  return g_strdup_printf ("syntax error: %s", msg);
}

/* ------------------------------------------------------------------------------------------ */
/* 3. validation of the tree                                                                   */

typedef enum
{
  OPTIONAL = 0,
  REQUIRED,
  NULLABLE,        /* optional, and null means "unset" (NAN) */
} Need;

/* Member of o, or NULL when absent (reports it when required). */
static JsonNode *
member (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need)
{
  JsonNode *n = json_object_get_member (o, key);
  if (n == NULL && need == REQUIRED)
    {
      char *p = path_member (path, key);
      problem_add (ctx, p, "required member is missing");
      g_free (p);
    }
  return n;
}

/* Reads a number into *out. Keeps *out (the default) when absent; NAN for null when NULLABLE.
 * Returns TRUE when *out holds a usable value (given or default). */
static gboolean
read_number (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need,
             double lo, double hi, const char *unit, double *out)
{
  JsonNode *n = member (ctx, o, path, key, need);
  if (n == NULL)
    return need != REQUIRED;
  gboolean ok = FALSE;
  if (JSON_NODE_HOLDS_NULL (n) && need == NULLABLE)
    {
      *out = NAN;
      ok = TRUE;
    }
  else if (!JSON_NODE_HOLDS_VALUE (n)
           || (json_node_get_value_type (n) != G_TYPE_INT64
               && json_node_get_value_type (n) != G_TYPE_DOUBLE))
    problem_add_at (ctx, path, key, "must be a number%s (found %s)", need == NULLABLE ? " or null" : "",
                 node_kind (n));
  else
    {
      double v = json_node_get_value_type (n) == G_TYPE_INT64 ? (double) json_node_get_int (n)
                                                              : json_node_get_double (n);
      char found[G_ASCII_DTOSTR_BUF_SIZE], blo[G_ASCII_DTOSTR_BUF_SIZE],
           bhi[G_ASCII_DTOSTR_BUF_SIZE];
      if (!isfinite (v))
        {
          format_number (found, sizeof found, v);
          problem_add_at (ctx, path, key, "must be a finite number (found %s)", found);
        }
      else if (v < lo || v > hi)
        {
          format_number (found, sizeof found, v);
          format_number (blo, sizeof blo, lo);
          format_number (bhi, sizeof bhi, hi);
          problem_add_at (ctx, path, key, "must be between %s and %s%s%s (found %s)", blo, bhi,
                       *unit ? " " : "", unit, found);
        }
      else
        {
          *out = v;
          ok = TRUE;
        }
    }
  return ok;
}

/* Reads a string (replacing *out, which holds the default) of at most max_chars characters.
 * non_empty: an empty string is a problem. */
static gboolean
read_string (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need,
             guint max_chars, gboolean non_empty, char **out)
{
  JsonNode *n = member (ctx, o, path, key, need);
  if (n == NULL)
    return need != REQUIRED;
  gboolean ok = FALSE;
  if (JSON_NODE_HOLDS_NULL (n) && need == NULLABLE)
    {
      g_clear_pointer (out, g_free);
      ok = TRUE;
    }
  else if (!JSON_NODE_HOLDS_VALUE (n) || json_node_get_value_type (n) != G_TYPE_STRING)
    problem_add_at (ctx, path, key, "must be a string (found %s)", node_kind (n));
  else
    {
      const char *s = json_node_get_string (n);
      glong chars = g_utf8_validate (s, -1, NULL) ? g_utf8_strlen (s, -1) : -1;
      if (chars < 0)
        problem_add_at (ctx, path, key, "must be valid UTF-8 text");
      else if (non_empty && *s == '\0')
        problem_add_at (ctx, path, key, "must not be empty");
      else if (chars > (glong) max_chars)
        problem_add_at (ctx, path, key, "must be at most %u characters long (found %ld)", max_chars, chars);
      else
        {
          g_free (*out);
          *out = g_strdup (s);
          ok = TRUE;
        }
    }
  return ok;
}

static gboolean
read_bool (Ctx *ctx, JsonObject *o, const char *path, const char *key, bool *out)
{
  JsonNode *n = member (ctx, o, path, key, OPTIONAL);
  if (n == NULL)
    return TRUE;
  if (!JSON_NODE_HOLDS_VALUE (n) || json_node_get_value_type (n) != G_TYPE_BOOLEAN)
    {
      char *p = path_member (path, key);
      problem_add (ctx, p, "must be true or false (found %s)", node_kind (n));
      g_free (p);
      return FALSE;
    }
  *out = json_node_get_boolean (n);
  return TRUE;
}

typedef bool (*FromNameFunc) (const char *name, void *out);

/* A string naming one of `choices` (a NULL-terminated list shown in the problem). */
static gboolean
read_choice (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need,
             const char *const *choices, int *out)
{
  JsonNode *n = member (ctx, o, path, key, need);
  if (n == NULL)
    return need != REQUIRED;
  gboolean ok = FALSE;
  if (!JSON_NODE_HOLDS_VALUE (n) || json_node_get_value_type (n) != G_TYPE_STRING)
    problem_add_at (ctx, path, key, "must be a string (found %s)", node_kind (n));
  else
    {
      const char *s = json_node_get_string (n);
      for (int i = 0; choices[i] != NULL; i++)
        if (strcmp (choices[i], s) == 0)
          {
            *out = i;
            ok = TRUE;
          }
      if (!ok)
        {
          GString *list = g_string_new (NULL);
          for (int i = 0; choices[i] != NULL; i++)
            g_string_append_printf (list, "%s\"%s\"",
                                    i == 0 ? "" : choices[i + 1] == NULL ? " or " : ", ",
                                    choices[i]);
          char *q = quote_for_problem (s);
          problem_add_at (ctx, path, key, "must be %s (found %s)", list->str, q);
          g_free (q);
          g_string_free (list, TRUE);
        }
    }
  return ok;
}

/* Object member: returns it, NULL when absent or of the wrong type (reported). */
static JsonObject *
read_object (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need)
{
  JsonNode *n = member (ctx, o, path, key, need);
  if (n == NULL || (JSON_NODE_HOLDS_NULL (n) && need == NULLABLE))
    return NULL;
  if (!JSON_NODE_HOLDS_OBJECT (n))
    {
      char *p = path_member (path, key);
      problem_add (ctx, p, "must be an object (found %s)", node_kind (n));
      g_free (p);
      return NULL;
    }
  return json_node_get_object (n);
}

static JsonArray *
read_array (Ctx *ctx, JsonObject *o, const char *path, const char *key, Need need)
{
  JsonNode *n = member (ctx, o, path, key, need);
  if (n == NULL)
    return NULL;
  if (!JSON_NODE_HOLDS_ARRAY (n))
    {
      char *p = path_member (path, key);
      problem_add (ctx, p, "must be an array (found %s)", node_kind (n));
      g_free (p);
      return NULL;
    }
  return json_node_get_array (n);
}

/* Unknown members (not in the NULL-terminated `known`) copied for the round trip. */
static JsonObject *
collect_extra (JsonObject *o, const char *const *known)
{
  JsonObject *extra = NULL;
  GList *names = json_object_get_members (o);
  for (GList *l = names; l != NULL; l = l->next)
    {
      const char *name = l->data;
      gboolean is_known = FALSE;
      for (int i = 0; known[i] != NULL && !is_known; i++)
        is_known = strcmp (known[i], name) == 0;
      if (is_known)
        continue;
      if (extra == NULL)
        extra = json_object_new ();
      json_object_set_member (extra, name,
                              aw_json_node_deep_copy (json_object_get_member (o, name)));
    }
  g_list_free (names);
  return extra;
}

static const char *const power_source_choices[] = {
  "spring", "electric_piston", "gas", "hpa", "co2", NULL
};
static const char *const energy_model_choices[] = {
  "constant_energy", "constant_velocity", "creep", "measured", NULL
};
static const char *const hop_mode_choices[] = { "auto", "lift_ratio", "spin_rpm", NULL };
static const char *const angle_unit_choices[] = { "mrad", "moa", NULL };
static const char *const drag_choices[] = { "clift", "morrison", "constant", "off", NULL };
static const char *const lift_choices[] = { "saturating", "shs", "loth", "linear", "off", NULL };
static const char *const chrono_hop_choices[] = { "off", "on", NULL };  /* + 1 = AwChronoHop */
static const char *const unit_choices[] = { "mps", "fps", NULL };

/* conditions */
static const char *const conditions_known[] = {
  "temperature_c", "pressure_hpa", "altitude_m", "humidity_pct", "wind_speed_mps",
  "wind_from_deg", NULL
};

static void
parse_conditions (Ctx *ctx, JsonObject *o, const char *path, AwProjectConditions *c)
{
  aw_project_conditions_init (c);
  read_number (ctx, o, path, "temperature_c", OPTIONAL, -40, 60, "°C", &c->temperature_c);
  gboolean has_p = json_object_has_member (o, "pressure_hpa");
  gboolean has_a = json_object_has_member (o, "altitude_m");
  if (has_p && has_a)
    problem_add (ctx, path && *path ? path : "conditions",
                 "give pressure_hpa or altitude_m, not both");
  else if (has_a)
    {
      c->pressure_hpa = NAN;
      c->altitude_m = 0.0;
      read_number (ctx, o, path, "altitude_m", REQUIRED, -500, 6000, "m", &c->altitude_m);
    }
  else
    read_number (ctx, o, path, "pressure_hpa", OPTIONAL, 500, 1100, "hPa", &c->pressure_hpa);
  read_number (ctx, o, path, "humidity_pct", OPTIONAL, 0, 100, "%", &c->humidity_pct);
  read_number (ctx, o, path, "wind_speed_mps", OPTIONAL, 0, 30, "m/s", &c->wind_speed_mps);
  read_number (ctx, o, path, "wind_from_deg", OPTIONAL, 0, 360, "degrees", &c->wind_from_deg);
  c->extra = collect_extra (o, conditions_known);
}

/* site rules */
static const char *const class_known[] = {
  "name", "energy_limit_j", "chrono_bb_mass_g", "hop_rule", "min_engagement_m", NULL
};
static const char *const site_rules_known[] = { "name", "notes", "classes", NULL };

static AwSiteRules *
parse_site_rules (Ctx *ctx, JsonNode *node, const char *path)
{
  if (!JSON_NODE_HOLDS_OBJECT (node))
    {
      problem_add (ctx, path, "must be an object (found %s)", node_kind (node));
      return NULL;
    }
  JsonObject *o = json_node_get_object (node);
  AwSiteRules *r = aw_site_rules_new ("");
  read_string (ctx, o, path, "name", REQUIRED, MAX_NAME_CHARS, TRUE, &r->name);
  read_string (ctx, o, path, "notes", OPTIONAL, MAX_TEXT_CHARS, FALSE, &r->notes);
  JsonArray *classes = read_array (ctx, o, path, "classes", REQUIRED);
  if (classes != NULL)
    {
      char *cpath = path_member (path, "classes");
      GHashTable *names = g_hash_table_new (g_str_hash, g_str_equal);
      for (guint i = 0; i < json_array_get_length (classes); i++)
        {
          char *ip = path_index (cpath, i);
          JsonNode *cn = json_array_get_element (classes, i);
          if (!JSON_NODE_HOLDS_OBJECT (cn))
            problem_add (ctx, ip, "must be an object (found %s)", node_kind (cn));
          else
            {
              JsonObject *co = json_node_get_object (cn);
              AwSiteClassRule *cr = aw_site_class_rule_new ("");
              if (read_string (ctx, co, ip, "name", REQUIRED, MAX_NAME_CHARS, TRUE, &cr->name))
                {
                  if (!g_hash_table_add (names, cr->name))
                    {
                      char *np = path_member (ip, "name");
                      char *q = quote_for_problem (cr->name);
                      problem_add (ctx, np, "duplicate class name %s", q);
                      g_free (q);
                      g_free (np);
                    }
                }
              read_number (ctx, co, ip, "energy_limit_j", REQUIRED, 0.1, 50, "J",
                           &cr->energy_limit_j);
              read_number (ctx, co, ip, "chrono_bb_mass_g", NULLABLE, 0.05, 2, "g",
                           &cr->chrono_bb_mass_g);
              read_string (ctx, co, ip, "hop_rule", OPTIONAL, MAX_TEXT_CHARS, FALSE,
                           &cr->hop_rule);
              read_number (ctx, co, ip, "min_engagement_m", OPTIONAL, 0, 200, "m",
                           &cr->min_engagement_m);
              cr->extra = collect_extra (co, class_known);
              g_ptr_array_add (r->classes, cr);
            }
          g_free (ip);
        }
      g_hash_table_unref (names);
      g_free (cpath);
    }
  r->extra = collect_extra (o, site_rules_known);
  return r;
}

/* setups */
static const char *const setup_known[] = {
  "name", "colour", "notes", "visible", "replica", "bb", "hop", "sighting", "muzzle_height_m",
  "band_half_height_m", "model", "conditions", "chrono", "observations", NULL
};
static const char *const replica_known[] = {
  "type", "power_source", "energy_model", "creep_pct_per_0_1g", "measured_points", "reference",
  NULL
};
static const char *const reference_known[] = { "mass_g", "velocity_mps", NULL };
static const char *const point_known[] = { "mass_g", "velocity_mps", NULL };
static const char *const bb_known[] = { "mass_g", "diameter_mm", NULL };
static const char *const hop_known[] = { "mode", "value", "tilt_deg", "max_lift_ratio", NULL };
static const char *const sighting_known[] = {
  "sight_height_m", "zero_distance_m", "angle_unit", NULL
};
static const char *const model_known[] = {
  "drag", "drag_cd", "lift", "lift_slope", "lift_factor", "drag_factor", "spin_decay_factor",
  NULL
};
static const char *const chrono_known[] = {
  "bb_mass_g", "hop", "unit", "velocities", "temperature_c", "date", "note", NULL
};
static const char *const observation_known[] = {
  "distance_m", "height_cm", "impact_distance_m", "note", NULL
};

static gboolean
colour_valid (const char *s)
{
  if (strlen (s) != 7 || s[0] != '#')
    return FALSE;
  for (int i = 1; i < 7; i++)
    if (!g_ascii_isxdigit (s[i]))
      return FALSE;
  return TRUE;
}

static gboolean
date_valid (const char *s)
{
  /* YYYY-MM-DD, or a full ISO 8601 date-time */
  if (strlen (s) == 10 && s[4] == '-' && s[7] == '-')
    {
      for (int i = 0; i < 10; i++)
        if (i != 4 && i != 7 && !g_ascii_isdigit (s[i]))
          return FALSE;
      int y = atoi (s), m = atoi (s + 5), d = atoi (s + 8);
      return y >= 1 && m >= 1 && m <= 12 && d >= 1
             && g_date_valid_dmy ((GDateDay) d, (GDateMonth) m, (GDateYear) y);
    }
  GDateTime *dt = g_date_time_new_from_iso8601 (s, NULL);
  if (dt == NULL)
    {
      /* a date-time without a time zone is read as UTC */
      GTimeZone *utc = g_time_zone_new_utc ();
      dt = g_date_time_new_from_iso8601 (s, utc);
      g_time_zone_unref (utc);
    }
  if (dt == NULL)
    return FALSE;
  g_date_time_unref (dt);
  return TRUE;
}

static void
parse_replica (Ctx *ctx, JsonObject *o, const char *path, AwReplica *r)
{
  read_string (ctx, o, path, "type", OPTIONAL, MAX_NAME_CHARS, FALSE, &r->type);
  int v;
  if (read_choice (ctx, o, path, "power_source", REQUIRED, power_source_choices, &v)
      && json_object_has_member (o, "power_source"))
    r->power_source = (AwPowerSource) v;
  if (json_object_has_member (o, "energy_model")
      && read_choice (ctx, o, path, "energy_model", OPTIONAL, energy_model_choices, &v))
    r->energy_model = (AwPowerModel) v;
  read_number (ctx, o, path, "creep_pct_per_0_1g",
               r->energy_model == AW_POWER_CREEP ? REQUIRED : OPTIONAL, -50, 100, "%",
               &r->creep_pct_per_01g);

  JsonArray *pts = read_array (ctx, o, path, "measured_points",
                               r->energy_model == AW_POWER_MEASURED ? REQUIRED : OPTIONAL);
  if (pts != NULL)
    {
      char *ppath = path_member (path, "measured_points");
      guint n = json_array_get_length (pts);
      if (n == 0 && r->energy_model == AW_POWER_MEASURED)
        problem_add (ctx, ppath, "must hold at least one point when energy_model is \"measured\"");
      else if (n > MAX_POINTS)
        problem_add (ctx, ppath, "must hold at most %d points (found %u)", MAX_POINTS, n);
      else
        for (guint i = 0; i < n; i++)
          {
            char *ip = path_index (ppath, i);
            JsonNode *pn = json_array_get_element (pts, i);
            if (!JSON_NODE_HOLDS_OBJECT (pn))
              problem_add (ctx, ip, "must be an object (found %s)", node_kind (pn));
            else
              {
                JsonObject *po = json_node_get_object (pn);
                AwReplicaPoint pt = { NAN, NAN, NULL };
                gboolean ok = read_number (ctx, po, ip, "mass_g", REQUIRED, 0.05, 2, "g",
                                           &pt.mass_g);
                ok &= read_number (ctx, po, ip, "velocity_mps", REQUIRED, 1, 300, "m/s",
                                   &pt.velocity_mps);
                for (guint j = 0; ok && j < r->points->len; j++)
                  if (g_array_index (r->points, AwReplicaPoint, j).mass_g == pt.mass_g)
                    {
                      char *mp = path_member (ip, "mass_g");
                      char b[G_ASCII_DTOSTR_BUF_SIZE];
                      format_number (b, sizeof b, pt.mass_g);
                      problem_add (ctx, mp, "duplicate mass %s g (also measured_points[%u])",
                                   b, j);
                      g_free (mp);
                      ok = FALSE;
                    }
                if (ok)
                  {
                    pt.extra = collect_extra (po, point_known);
                    g_array_append_val (r->points, pt);
                  }
              }
            g_free (ip);
          }
      g_free (ppath);
    }

  JsonObject *ref = read_object (ctx, o, path, "reference", REQUIRED);
  if (ref != NULL)
    {
      char *rp = path_member (path, "reference");
      read_number (ctx, ref, rp, "mass_g", REQUIRED, 0.05, 2, "g", &r->ref_mass_g);
      read_number (ctx, ref, rp, "velocity_mps", REQUIRED, 1, 300, "m/s", &r->ref_velocity_mps);
      r->reference_extra = collect_extra (ref, reference_known);
      g_free (rp);
    }
  r->extra = collect_extra (o, replica_known);
}

/* returns an AwChronoString (gpointer: a ParseItemFunc for read_list) */
static gpointer
parse_chrono (Ctx *ctx, JsonNode *node, const char *path)
{
  if (!JSON_NODE_HOLDS_OBJECT (node))
    {
      problem_add (ctx, path, "must be an object (found %s)", node_kind (node));
      return NULL;
    }
  JsonObject *o = json_node_get_object (node);
  AwChronoString *c = aw_chrono_string_new ();
  int v;
  read_number (ctx, o, path, "bb_mass_g", REQUIRED, 0.05, 2, "g", &c->bb_mass_g);
  if (json_object_has_member (o, "hop")
      && read_choice (ctx, o, path, "hop", OPTIONAL, chrono_hop_choices, &v))
    c->hop = (AwChronoHop) (v + 1);
  gboolean unit_ok = read_choice (ctx, o, path, "unit", REQUIRED, unit_choices, &v)
                     && json_object_has_member (o, "unit");
  if (unit_ok)
    c->unit = (AwVelocityUnit) v;
  JsonArray *vel = read_array (ctx, o, path, "velocities", REQUIRED);
  if (vel != NULL)
    {
      char *vp = path_member (path, "velocities");
      guint n = json_array_get_length (vel);
      if (n == 0)
        problem_add (ctx, vp, "must hold at least one velocity");
      else if (n > MAX_SHOTS)
        problem_add (ctx, vp, "must hold at most %d velocities (found %u)", MAX_SHOTS, n);
      else
        {
          double lo = c->unit == AW_VELOCITY_UNIT_FPS ? 3 : 1;
          double hi = c->unit == AW_VELOCITY_UNIT_FPS ? 985 : 300;
          const char *unit = c->unit == AW_VELOCITY_UNIT_FPS ? "fps" : "m/s";
          for (guint i = 0; i < n; i++)
            {
              JsonNode *e = json_array_get_element (vel, i);
              if (!JSON_NODE_HOLDS_VALUE (e)
                  || (json_node_get_value_type (e) != G_TYPE_INT64
                      && json_node_get_value_type (e) != G_TYPE_DOUBLE))
                {
                  char *ip = path_index (vp, i);
                  problem_add (ctx, ip, "must be a number (found %s)", node_kind (e));
                  g_free (ip);
                  continue;
                }
              double x = json_node_get_value_type (e) == G_TYPE_INT64
                         ? (double) json_node_get_int (e) : json_node_get_double (e);
              if (isfinite (x) && (!unit_ok || (x >= lo && x <= hi)))
                {
                  /* the common case: no message, nothing formatted */
                  if (unit_ok)
                    g_array_append_val (c->velocities, x);
                  continue;
                }
              char b[G_ASCII_DTOSTR_BUF_SIZE], blo[G_ASCII_DTOSTR_BUF_SIZE],
                   bhi[G_ASCII_DTOSTR_BUF_SIZE];
              char *ip = path_index (vp, i);
              format_number (b, sizeof b, x);
              format_number (blo, sizeof blo, lo);
              format_number (bhi, sizeof bhi, hi);
              if (!isfinite (x))
                problem_add (ctx, ip, "must be a finite number (found %s)", b);
              else
                problem_add (ctx, ip, "must be between %s and %s %s (found %s)", blo, bhi,
                             unit, b);
              g_free (ip);
            }
        }
      g_free (vp);
    }
  c->temperature_c = NAN;
  read_number (ctx, o, path, "temperature_c", OPTIONAL, -40, 60, "°C", &c->temperature_c);
  if (read_string (ctx, o, path, "date", OPTIONAL, 64, TRUE, &c->date) && c->date != NULL
      && !date_valid (c->date))
    {
      char *dp = path_member (path, "date");
      char *q = quote_for_problem (c->date);
      problem_add (ctx, dp, "must be an ISO 8601 date such as 2024-05-18 (found %s)", q);
      g_free (q);
      g_free (dp);
    }
  read_string (ctx, o, path, "note", OPTIONAL, MAX_TEXT_CHARS, FALSE, &c->note);
  c->extra = collect_extra (o, chrono_known);
  return c;
}

/* returns an AwObservation (gpointer: a ParseItemFunc for read_list) */
static gpointer
parse_observation (Ctx *ctx, JsonNode *node, const char *path)
{
  if (!JSON_NODE_HOLDS_OBJECT (node))
    {
      problem_add (ctx, path, "must be an object (found %s)", node_kind (node));
      return NULL;
    }
  JsonObject *o = json_node_get_object (node);
  AwObservation *ob = aw_observation_new ();
  gboolean has_d = json_object_has_member (o, "distance_m");
  gboolean has_h = json_object_has_member (o, "height_cm");
  gboolean has_i = json_object_has_member (o, "impact_distance_m");
  if (has_i && !has_d && !has_h)
    {
      ob->kind = AW_OBSERVATION_IMPACT;
      ob->height_cm = NAN;
      read_number (ctx, o, path, "impact_distance_m", REQUIRED, 0.5, 200, "m", &ob->distance_m);
    }
  else if (!has_i && (has_d || has_h))
    {
      ob->kind = AW_OBSERVATION_HEIGHT;
      read_number (ctx, o, path, "distance_m", REQUIRED, 0.5, 200, "m", &ob->distance_m);
      read_number (ctx, o, path, "height_cm", REQUIRED, -500, 500, "cm", &ob->height_cm);
    }
  else
    problem_add (ctx, path, "give distance_m with height_cm, or impact_distance_m alone");
  read_string (ctx, o, path, "note", OPTIONAL, MAX_TEXT_CHARS, FALSE, &ob->note);
  ob->extra = collect_extra (o, observation_known);
  return ob;
}

/* Parses every element of the optional array member `key` with parse_item and appends the ones
 * that parse to list; the others are reported by parse_item under "path.key[i]". */
typedef gpointer (*ParseItemFunc) (Ctx *ctx, JsonNode *node, const char *path);

static void
read_list (Ctx *ctx, JsonObject *o, const char *path, const char *key, ParseItemFunc parse_item,
           GPtrArray *list)
{
  JsonArray *a = read_array (ctx, o, path, key, OPTIONAL);
  if (a == NULL)
    return;
  char *lp = path_member (path, key);
  for (guint i = 0; i < json_array_get_length (a); i++)
    {
      char *ip = path_index (lp, i);
      gpointer item = parse_item (ctx, json_array_get_element (a, i), ip);
      if (item != NULL)
        g_ptr_array_add (list, item);
      g_free (ip);
    }
  g_free (lp);
}

static AwSetup *
parse_setup (Ctx *ctx, JsonNode *node, const char *path)
{
  if (!JSON_NODE_HOLDS_OBJECT (node))
    {
      problem_add (ctx, path, "must be an object (found %s)", node_kind (node));
      return NULL;
    }
  JsonObject *o = json_node_get_object (node);
  AwSetup *s = aw_setup_new ("");
  int v;

  read_string (ctx, o, path, "name", REQUIRED, MAX_NAME_CHARS, TRUE, &s->name);
  if (read_string (ctx, o, path, "colour", OPTIONAL, 64, FALSE, &s->colour)
      && !colour_valid (s->colour))
    {
      char *cp = path_member (path, "colour");
      char *q = quote_for_problem (s->colour);
      problem_add (ctx, cp, "must be a colour written \"#rrggbb\" (found %s)", q);
      g_free (q);
      g_free (cp);
    }
  read_string (ctx, o, path, "notes", OPTIONAL, MAX_TEXT_CHARS, FALSE, &s->notes);
  read_bool (ctx, o, path, "visible", &s->visible);

  JsonObject *ro = read_object (ctx, o, path, "replica", REQUIRED);
  if (ro != NULL)
    {
      char *rp = path_member (path, "replica");
      parse_replica (ctx, ro, rp, &s->replica);
      g_free (rp);
    }

  JsonObject *bo = read_object (ctx, o, path, "bb", REQUIRED);
  if (bo != NULL)
    {
      char *bp = path_member (path, "bb");
      read_number (ctx, bo, bp, "mass_g", REQUIRED, 0.05, 2, "g", &s->bb.mass_g);
      read_number (ctx, bo, bp, "diameter_mm", OPTIONAL, 4, 10, "mm", &s->bb.diameter_mm);
      s->bb.extra = collect_extra (bo, bb_known);
      g_free (bp);
    }

  JsonObject *ho = read_object (ctx, o, path, "hop", OPTIONAL);
  if (ho != NULL)
    {
      char *hp = path_member (path, "hop");
      if (json_object_has_member (ho, "mode")
          && read_choice (ctx, ho, hp, "mode", OPTIONAL, hop_mode_choices, &v))
        s->hop.mode = (AwHopMode) v;
      switch (s->hop.mode)
        {
        case AW_HOP_MODE_LIFT_RATIO:
          read_number (ctx, ho, hp, "value", REQUIRED, 0, 10, "", &s->hop.value);
          break;
        case AW_HOP_MODE_SPIN:
          read_number (ctx, ho, hp, "value", REQUIRED, 0, 900000, "rpm", &s->hop.value);
          break;
        case AW_HOP_MODE_AUTO:
        default:
          read_number (ctx, ho, hp, "value", OPTIONAL, 0, 900000, "", &s->hop.value);
          break;
        }
      read_number (ctx, ho, hp, "tilt_deg", OPTIONAL, -90, 90, "degrees", &s->hop.tilt_deg);
      /* the hop limit: absent = none (modelling assumption, no source: see aw-project.h) */
      read_number (ctx, ho, hp, "max_lift_ratio", OPTIONAL, AW_HOP_MAX_LIFT_RATIO_MIN,
                   AW_HOP_MAX_LIFT_RATIO_MAX, "", &s->hop.max_lift_ratio);
      s->hop.extra = collect_extra (ho, hop_known);
      g_free (hp);
    }

  JsonObject *so = read_object (ctx, o, path, "sighting", OPTIONAL);
  if (so != NULL)
    {
      char *sp = path_member (path, "sighting");
      read_number (ctx, so, sp, "sight_height_m", OPTIONAL, -0.1, 0.5, "m",
                   &s->sighting.sight_height_m);
      read_number (ctx, so, sp, "zero_distance_m", NULLABLE, 1, 200, "m",
                   &s->sighting.zero_distance_m);
      if (json_object_has_member (so, "angle_unit")
          && read_choice (ctx, so, sp, "angle_unit", OPTIONAL, angle_unit_choices, &v))
        s->sighting.angle_unit = (AwAngleUnit) v;
      s->sighting.extra = collect_extra (so, sighting_known);
      g_free (sp);
    }

  read_number (ctx, o, path, "muzzle_height_m", OPTIONAL, 0, 10, "m", &s->muzzle_height_m);
  read_number (ctx, o, path, "band_half_height_m", OPTIONAL, 0.01, 2, "m",
               &s->band_half_height_m);

  JsonObject *mo = read_object (ctx, o, path, "model", OPTIONAL);
  if (mo != NULL)
    {
      char *mp = path_member (path, "model");
      if (json_object_has_member (mo, "drag")
          && read_choice (ctx, mo, mp, "drag", OPTIONAL, drag_choices, &v))
        s->model.drag = (AwDragModel) v;
      read_number (ctx, mo, mp, "drag_cd", OPTIONAL, 0.05, 5, "", &s->model.drag_cd);
      if (json_object_has_member (mo, "lift")
          && read_choice (ctx, mo, mp, "lift", OPTIONAL, lift_choices, &v))
        s->model.lift = (AwLiftModel) v;
      read_number (ctx, mo, mp, "lift_slope", OPTIONAL, 0.001, 5, "", &s->model.lift_slope);
      read_number (ctx, mo, mp, "lift_factor", OPTIONAL, 0, 10, "", &s->model.lift_factor);
      read_number (ctx, mo, mp, "drag_factor", OPTIONAL, 0, 10, "", &s->model.drag_factor);
      read_number (ctx, mo, mp, "spin_decay_factor", OPTIONAL, 0, 10, "",
                   &s->model.spin_decay_factor);
      s->model.extra = collect_extra (mo, model_known);
      g_free (mp);
    }

  JsonObject *co = read_object (ctx, o, path, "conditions", NULLABLE);
  if (co != NULL)
    {
      char *cp = path_member (path, "conditions");
      s->conditions = g_new0 (AwProjectConditions, 1);
      parse_conditions (ctx, co, cp, s->conditions);
      g_free (cp);
    }

  read_list (ctx, o, path, "chrono", parse_chrono, s->chrono);
  read_list (ctx, o, path, "observations", parse_observation, s->observations);

  s->extra = collect_extra (o, setup_known);
  return s;
}

static const char *const project_known[] = {
  "format", "version", "name", "notes", "conditions", "site_rules", "setups", NULL
};

static const char *
entry_name (JsonNode *node)
{
  if (!JSON_NODE_HOLDS_OBJECT (node))
    return NULL;
  JsonNode *n = json_object_get_member (json_node_get_object (node), "name");
  if (n == NULL || !JSON_NODE_HOLDS_VALUE (n) || json_node_get_value_type (n) != G_TYPE_STRING)
    return NULL;
  return json_node_get_string (n);
}

/* A list of named entries (setups or site_rules): each bad entry becomes an AwRejectedEntry. */
typedef gpointer (*ParseEntryFunc) (Ctx *ctx, JsonNode *node, const char *path);

static void
parse_entries (Ctx *ctx, JsonObject *root, const char *list, ParseEntryFunc parse,
               GDestroyNotify free_entry, GPtrArray *out, GPtrArray *rejected)
{
  JsonArray *arr = read_array (ctx, root, "", list, OPTIONAL);
  if (arr == NULL)
    {
      ctx->fatal = ctx->count;  /* a wrong type here is a problem of the whole file */
      return;
    }
  GHashTable *names = g_hash_table_new (g_str_hash, g_str_equal);
  GHashTable *first = g_hash_table_new (g_str_hash, g_str_equal);
  for (guint i = 0; i < json_array_get_length (arr); i++)
    {
      JsonNode *node = json_array_get_element (arr, i);
      char *path = path_index (list, i);
      guint before = ctx->count;
      gpointer entry = parse (ctx, node, path);
      const char *name = entry_name (node);
      if (entry != NULL && ctx->count == before && name != NULL)
        {
          if (g_hash_table_contains (names, name))
            {
              char *np = path_member (path, "name");
              char *q = quote_for_problem (name);
              problem_add (ctx, np, "duplicate %s name %s (also %s[%u])",
                           strcmp (list, "setups") == 0 ? "setup" : "site rules", q, list,
                           GPOINTER_TO_UINT (g_hash_table_lookup (first, name)));
              g_free (q);
              g_free (np);
            }
          else
            {
              g_hash_table_add (names, (gpointer) name);
              g_hash_table_insert (first, (gpointer) name, GUINT_TO_POINTER (i));
            }
        }
      if (entry != NULL && ctx->count == before)
        g_ptr_array_add (out, entry);
      else
        {
          if (entry != NULL)
            free_entry (entry);
          g_ptr_array_add (rejected, aw_rejected_entry_new (list, i, name, node));
        }
      g_free (path);
    }
  g_hash_table_unref (first);
  g_hash_table_unref (names);
}

static AwProject *
parse_project (Ctx *ctx, JsonNode *root)
{
  if (root == NULL)
    {
      problem_add (ctx, NULL, "syntax error: the file is empty");
      ctx->fatal++;
      g_set_error_literal (&ctx->error, AW_CORE_ERROR, AW_CORE_ERROR_SYNTAX, "");
      return NULL;
    }
  if (!JSON_NODE_HOLDS_OBJECT (root))
    {
      problem_add (ctx, "top level", "must be an object (found %s)", node_kind (root));
      ctx->fatal++;
      return NULL;
    }
  JsonObject *o = json_node_get_object (root);

  /* format and version first: a file of another kind or a newer format is not validated */
  char *format = NULL;
  if (!read_string (ctx, o, "", "format", REQUIRED, 64, FALSE, &format)
      || g_strcmp0 (format, AW_PROJECT_FORMAT_NAME) != 0)
    {
      if (format != NULL)
        {
          char *q = quote_for_problem (format);
          problem_add (ctx, "format", "must be \"%s\" (found %s)", AW_PROJECT_FORMAT_NAME, q);
          g_free (q);
        }
      g_free (format);
      ctx->fatal = ctx->count;
      return NULL;
    }
  g_free (format);

  JsonNode *vn = member (ctx, o, "", "version", REQUIRED);
  if (vn == NULL)
    {
      ctx->fatal = ctx->count;
      return NULL;
    }
  gint64 version = 0;
  if (JSON_NODE_HOLDS_VALUE (vn) && json_node_get_value_type (vn) == G_TYPE_INT64)
    version = json_node_get_int (vn);
  else if (JSON_NODE_HOLDS_VALUE (vn) && json_node_get_value_type (vn) == G_TYPE_DOUBLE
           && json_node_get_double (vn) == floor (json_node_get_double (vn))
           && fabs (json_node_get_double (vn)) < 1e15)
    version = (gint64) json_node_get_double (vn);
  else
    {
      problem_add (ctx, "version", "must be a whole number (found %s)", node_kind (vn));
      ctx->fatal = ctx->count;
      return NULL;
    }
  if (version > AW_PROJECT_FORMAT_VERSION)
    {
      problem_add (ctx, "version",
                   "the file has format version %" G_GINT64_FORMAT ", newer than version %d "
                   "that this program reads", version, AW_PROJECT_FORMAT_VERSION);
      ctx->fatal = ctx->count;
      g_set_error_literal (&ctx->error, AW_CORE_ERROR, AW_CORE_ERROR_VERSION, "");
      return NULL;
    }
  if (version < 1)
    {
      problem_add (ctx, "version", "must be 1 or more (found %" G_GINT64_FORMAT ")", version);
      ctx->fatal = ctx->count;
      return NULL;
    }

  AwProject *p = aw_project_new ();
  read_string (ctx, o, "", "name", OPTIONAL, MAX_NAME_CHARS, FALSE, &p->name);
  read_string (ctx, o, "", "notes", OPTIONAL, MAX_TEXT_CHARS, FALSE, &p->notes);
  JsonObject *co = read_object (ctx, o, "", "conditions", OPTIONAL);
  if (co != NULL)
    parse_conditions (ctx, co, "conditions", &p->conditions);
  p->extra = collect_extra (o, project_known);
  ctx->fatal = ctx->count;

  parse_entries (ctx, o, "site_rules", (ParseEntryFunc) parse_site_rules,
                 (GDestroyNotify) aw_site_rules_free, p->site_rules, p->rejected);
  parse_entries (ctx, o, "setups", (ParseEntryFunc) parse_setup,
                 (GDestroyNotify) aw_setup_free, p->setups, p->rejected);
  return p;
}

/* Runs the three steps; *out_error receives the code of the outcome. Returns the project
 * when it parsed (even with entry problems), NULL otherwise. */
static AwProject *
load_into (Ctx *ctx, const char *data, gsize len)
{
  if (!prescan (ctx, data, len))
    return NULL;
  if (ctx->fatal > 0)
    {
      /* duplicate members, out-of-range literals or NUL escapes: json-glib would lose data */
      return NULL;
    }

  g_autoptr (JsonParser) parser = json_parser_new_immutable ();
  GError *jerr = NULL;
  if (!json_parser_load_from_data (parser, data, (gssize) len, &jerr))
    {
      char *msg = syntax_message (jerr->message);
      problem_add (ctx, NULL, "%s", msg);
      g_free (msg);
      g_error_free (jerr);
      ctx->fatal++;
      g_set_error_literal (&ctx->error, AW_CORE_ERROR, AW_CORE_ERROR_SYNTAX, "");
      return NULL;
    }
  return parse_project (ctx, json_parser_get_root (parser));
}

static AwProject *
finish_load (Ctx *ctx, AwProject *p, AwProjectLoadFlags flags, GError **error)
{
  gboolean accept = p != NULL
                    && (ctx->count == 0
                        || ((flags & AW_PROJECT_LOAD_LENIENT) && ctx->fatal == 0));
  if (accept)
    {
      g_clear_error (&ctx->error);
      return p;
    }
  aw_project_free (p);
  AwCoreError code = ctx->error ? (AwCoreError) ctx->error->code : AW_CORE_ERROR_INVALID;
  g_clear_error (&ctx->error);
  const char *first = ctx->problems->len > 0 ? ctx->problems->pdata[0] : "invalid project";
  if (ctx->count > 1)
    g_set_error (error, AW_CORE_ERROR, code, "%s (and %u more problems)", first, ctx->count - 1);
  else
    g_set_error_literal (error, AW_CORE_ERROR, code, first);
  return NULL;
}

AwProject *
aw_project_load_data (const char *data, gssize length, AwProjectLoadFlags flags,
                      GPtrArray *problems, GError **error)
{
  g_return_val_if_fail (data != NULL || length == 0, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);
  gsize len = length < 0 ? strlen (data) : (gsize) length;
  Ctx ctx = { problems ? g_ptr_array_ref (problems) : g_ptr_array_new_with_free_func (g_free),
              0, 0, NULL };
  AwProject *p = load_into (&ctx, data ? data : "", len);
  p = finish_load (&ctx, p, flags, error);
  g_ptr_array_unref (ctx.problems);
  return p;
}

AwProject *
aw_project_load_file (const char *path, AwProjectLoadFlags flags, GPtrArray *problems,
                      GError **error)
{
  g_return_val_if_fail (path != NULL, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);
  GStatBuf st;
  if (g_stat (path, &st) == 0 && S_ISREG (st.st_mode) && (guint64) st.st_size > MAX_FILE_BYTES)
    {
      char *msg = g_strdup_printf ("file is larger than %u MB", MAX_FILE_BYTES >> 20);
      if (problems)
        g_ptr_array_add (problems, g_strdup (msg));
      g_set_error_literal (error, AW_CORE_ERROR, AW_CORE_ERROR_IO, msg);
      g_free (msg);
      return NULL;
    }
  char *data = NULL;
  gsize len = 0;
  GError *ioerr = NULL;
  if (!g_file_get_contents (path, &data, &len, &ioerr))
    {
      if (problems)
        g_ptr_array_add (problems, g_strdup (ioerr->message));
      g_set_error_literal (error, AW_CORE_ERROR, AW_CORE_ERROR_IO, ioerr->message);
      g_error_free (ioerr);
      return NULL;
    }
  AwProject *p = aw_project_load_data (data, (gssize) len, flags, problems, error);
  g_free (data);
  return p;
}

char *
aw_project_problems_join (GPtrArray *problems)
{
  GString *s = g_string_new (NULL);
  for (guint i = 0; problems != NULL && i < problems->len; i++)
    {
      g_string_append (s, problems->pdata[i]);
      g_string_append_c (s, '\n');
    }
  return g_string_free (s, FALSE);
}

/* ------------------------------------------------------------------------------------------ */
/* model → JSON tree                                                                           */

static void
set_num (JsonObject *o, const char *key, double v)
{
  json_object_set_double_member (o, key, v);
}

static void
set_num_or_null (JsonObject *o, const char *key, double v)
{
  if (isnan (v))
    json_object_set_null_member (o, key);
  else
    json_object_set_double_member (o, key, v);
}

static void
set_str (JsonObject *o, const char *key, const char *s)
{
  json_object_set_string_member (o, key, s ? s : "");
}

/* Appends unknown members after the known ones (a known name in extra is ignored). */
static void
add_extra (JsonObject *o, JsonObject *extra)
{
  if (extra == NULL)
    return;
  GList *names = json_object_get_members (extra);
  for (GList *l = names; l != NULL; l = l->next)
    if (!json_object_has_member (o, l->data))
      json_object_set_member (o, l->data,
                              aw_json_node_deep_copy (json_object_get_member (extra, l->data)));
  g_list_free (names);
}

static JsonNode *
object_node (JsonObject *o)
{
  JsonNode *n = json_node_new (JSON_NODE_OBJECT);
  json_node_take_object (n, o);
  return n;
}

static JsonObject *
conditions_to_json (const AwProjectConditions *c)
{
  JsonObject *o = json_object_new ();
  set_num (o, "temperature_c", c->temperature_c);
  if (!isnan (c->altitude_m) && isnan (c->pressure_hpa))
    set_num (o, "altitude_m", c->altitude_m);
  else if (!isnan (c->altitude_m))
    {
      /* both set: written as they are, and validation reports it */
      set_num (o, "pressure_hpa", c->pressure_hpa);
      set_num (o, "altitude_m", c->altitude_m);
    }
  else
    set_num (o, "pressure_hpa", c->pressure_hpa);
  set_num (o, "humidity_pct", c->humidity_pct);
  set_num (o, "wind_speed_mps", c->wind_speed_mps);
  set_num (o, "wind_from_deg", c->wind_from_deg);
  add_extra (o, c->extra);
  return o;
}

static JsonObject *
site_rules_to_json (const AwSiteRules *r)
{
  JsonObject *o = json_object_new ();
  set_str (o, "name", r->name);
  set_str (o, "notes", r->notes);
  JsonArray *classes = json_array_new ();
  for (guint i = 0; i < r->classes->len; i++)
    {
      const AwSiteClassRule *c = r->classes->pdata[i];
      JsonObject *co = json_object_new ();
      set_str (co, "name", c->name);
      set_num (co, "energy_limit_j", c->energy_limit_j);
      set_num_or_null (co, "chrono_bb_mass_g", c->chrono_bb_mass_g);
      set_str (co, "hop_rule", c->hop_rule);
      set_num (co, "min_engagement_m", c->min_engagement_m);
      add_extra (co, c->extra);
      json_array_add_object_element (classes, co);
    }
  json_object_set_array_member (o, "classes", classes);
  add_extra (o, r->extra);
  return o;
}

static JsonObject *
setup_to_json (const AwSetup *s)
{
  JsonObject *o = json_object_new ();
  set_str (o, "name", s->name);
  set_str (o, "colour", s->colour);
  set_str (o, "notes", s->notes);
  json_object_set_boolean_member (o, "visible", s->visible);

  const AwReplica *r = &s->replica;
  JsonObject *ro = json_object_new ();
  set_str (ro, "type", r->type);
  const char *ps = aw_power_source_to_name (r->power_source);
  json_object_set_string_member (ro, "power_source", ps ? ps : "?");
  const char *em = aw_energy_model_to_name (r->energy_model);
  json_object_set_string_member (ro, "energy_model", em ? em : "?");
  if (r->energy_model == AW_POWER_CREEP || r->creep_pct_per_01g != 0.0)
    set_num (ro, "creep_pct_per_0_1g", r->creep_pct_per_01g);
  if (r->points->len > 0 || r->energy_model == AW_POWER_MEASURED)
    {
      JsonArray *pts = json_array_new ();
      for (guint i = 0; i < r->points->len; i++)
        {
          const AwReplicaPoint *pt = &g_array_index (r->points, AwReplicaPoint, i);
          JsonObject *po = json_object_new ();
          set_num (po, "mass_g", pt->mass_g);
          set_num (po, "velocity_mps", pt->velocity_mps);
          add_extra (po, pt->extra);
          json_array_add_object_element (pts, po);
        }
      json_object_set_array_member (ro, "measured_points", pts);
    }
  JsonObject *ref = json_object_new ();
  set_num (ref, "mass_g", r->ref_mass_g);
  set_num (ref, "velocity_mps", r->ref_velocity_mps);
  add_extra (ref, r->reference_extra);
  json_object_set_object_member (ro, "reference", ref);
  add_extra (ro, r->extra);
  json_object_set_object_member (o, "replica", ro);

  JsonObject *bo = json_object_new ();
  set_num (bo, "mass_g", s->bb.mass_g);
  set_num (bo, "diameter_mm", s->bb.diameter_mm);
  add_extra (bo, s->bb.extra);
  json_object_set_object_member (o, "bb", bo);

  JsonObject *ho = json_object_new ();
  const char *hm = aw_hop_mode_to_name (s->hop.mode);
  json_object_set_string_member (ho, "mode", hm ? hm : "?");
  set_num (ho, "value", s->hop.value);
  set_num (ho, "tilt_deg", s->hop.tilt_deg);
  if (!isnan (s->hop.max_lift_ratio))
    set_num (ho, "max_lift_ratio", s->hop.max_lift_ratio);
  add_extra (ho, s->hop.extra);
  json_object_set_object_member (o, "hop", ho);

  JsonObject *so = json_object_new ();
  set_num (so, "sight_height_m", s->sighting.sight_height_m);
  set_num_or_null (so, "zero_distance_m", s->sighting.zero_distance_m);
  const char *au = aw_angle_unit_to_name (s->sighting.angle_unit);
  json_object_set_string_member (so, "angle_unit", au ? au : "?");
  add_extra (so, s->sighting.extra);
  json_object_set_object_member (o, "sighting", so);

  set_num (o, "muzzle_height_m", s->muzzle_height_m);
  set_num (o, "band_half_height_m", s->band_half_height_m);

  JsonObject *mo = json_object_new ();
  const char *dm = aw_drag_model_to_name (s->model.drag);
  json_object_set_string_member (mo, "drag", dm ? dm : "?");
  set_num (mo, "drag_cd", s->model.drag_cd);
  const char *lm = aw_lift_model_to_name (s->model.lift);
  json_object_set_string_member (mo, "lift", lm ? lm : "?");
  set_num (mo, "lift_slope", s->model.lift_slope);
  set_num (mo, "lift_factor", s->model.lift_factor);
  set_num (mo, "drag_factor", s->model.drag_factor);
  set_num (mo, "spin_decay_factor", s->model.spin_decay_factor);
  add_extra (mo, s->model.extra);
  json_object_set_object_member (o, "model", mo);

  if (s->conditions != NULL)
    json_object_set_object_member (o, "conditions", conditions_to_json (s->conditions));

  JsonArray *ch = json_array_new ();
  for (guint i = 0; i < s->chrono->len; i++)
    {
      const AwChronoString *c = s->chrono->pdata[i];
      JsonObject *co = json_object_new ();
      set_num (co, "bb_mass_g", c->bb_mass_g);
      if (c->hop == AW_CHRONO_HOP_ON || c->hop == AW_CHRONO_HOP_OFF)
        json_object_set_string_member (co, "hop", c->hop == AW_CHRONO_HOP_ON ? "on" : "off");
      else if (c->hop != AW_CHRONO_HOP_UNSPECIFIED)
        json_object_set_string_member (co, "hop", "?");
      json_object_set_string_member (co, "unit", c->unit == AW_VELOCITY_UNIT_FPS ? "fps"
                                                 : c->unit == AW_VELOCITY_UNIT_MPS ? "mps"
                                                                                   : "?");
      JsonArray *va = json_array_sized_new (c->velocities->len);
      for (guint j = 0; j < c->velocities->len; j++)
        json_array_add_double_element (va, g_array_index (c->velocities, double, j));
      json_object_set_array_member (co, "velocities", va);
      if (!isnan (c->temperature_c))
        set_num (co, "temperature_c", c->temperature_c);
      if (c->date != NULL)
        set_str (co, "date", c->date);
      set_str (co, "note", c->note);
      add_extra (co, c->extra);
      json_array_add_object_element (ch, co);
    }
  json_object_set_array_member (o, "chrono", ch);

  JsonArray *obs = json_array_new ();
  for (guint i = 0; i < s->observations->len; i++)
    {
      const AwObservation *ob = s->observations->pdata[i];
      JsonObject *oo = json_object_new ();
      if (ob->kind == AW_OBSERVATION_IMPACT)
        set_num (oo, "impact_distance_m", ob->distance_m);
      else
        {
          set_num (oo, "distance_m", ob->distance_m);
          set_num (oo, "height_cm", ob->height_cm);
        }
      set_str (oo, "note", ob->note);
      add_extra (oo, ob->extra);
      json_array_add_object_element (obs, oo);
    }
  json_object_set_array_member (o, "observations", obs);

  add_extra (o, s->extra);
  return o;
}

static gint
compare_rejected (gconstpointer a, gconstpointer b)
{
  const AwRejectedEntry *ea = *(AwRejectedEntry *const *) a;
  const AwRejectedEntry *eb = *(AwRejectedEntry *const *) b;
  return ea->index < eb->index ? -1 : ea->index > eb->index ? 1 : 0;
}

/* A list with the rejected entries of `list` put back at their positions. */
static JsonArray *
entries_with_rejected (const AwProject *p, const char *list, JsonArray *valid, gboolean with)
{
  if (!with)
    return valid;
  GPtrArray *mine = g_ptr_array_new ();
  for (guint i = 0; i < p->rejected->len; i++)
    {
      AwRejectedEntry *e = p->rejected->pdata[i];
      if (g_strcmp0 (e->list, list) == 0)
        g_ptr_array_add (mine, e);
    }
  if (mine->len == 0)
    {
      g_ptr_array_unref (mine);
      return valid;
    }
  g_ptr_array_sort (mine, compare_rejected);
  JsonArray *out = json_array_new ();
  guint vi = 0, nvalid = json_array_get_length (valid);
  for (guint k = 0; k < mine->len; k++)
    {
      AwRejectedEntry *e = mine->pdata[k];
      while (json_array_get_length (out) < e->index && vi < nvalid)
        json_array_add_element (out, json_node_ref (json_array_get_element (valid, vi++)));
      json_array_add_element (out, aw_json_node_deep_copy (e->raw));
    }
  while (vi < nvalid)
    json_array_add_element (out, json_node_ref (json_array_get_element (valid, vi++)));
  json_array_unref (valid);
  g_ptr_array_unref (mine);
  return out;
}

static JsonNode *
project_to_json (const AwProject *p, gboolean with_rejected)
{
  JsonObject *o = json_object_new ();
  json_object_set_string_member (o, "format", AW_PROJECT_FORMAT_NAME);
  json_object_set_int_member (o, "version", AW_PROJECT_FORMAT_VERSION);
  set_str (o, "name", p->name);
  set_str (o, "notes", p->notes);
  json_object_set_object_member (o, "conditions", conditions_to_json (&p->conditions));
  JsonArray *rules = json_array_new ();
  for (guint i = 0; i < p->site_rules->len; i++)
    json_array_add_object_element (rules, site_rules_to_json (p->site_rules->pdata[i]));
  json_object_set_array_member (o, "site_rules",
                                entries_with_rejected (p, "site_rules", rules, with_rejected));
  JsonArray *setups = json_array_sized_new (p->setups->len);
  for (guint i = 0; i < p->setups->len; i++)
    json_array_add_object_element (setups, setup_to_json (p->setups->pdata[i]));
  json_object_set_array_member (o, "setups",
                                entries_with_rejected (p, "setups", setups, with_rejected));
  add_extra (o, p->extra);
  return object_node (o);
}

JsonNode *
aw_project_to_json (const AwProject *project)
{
  g_return_val_if_fail (project != NULL, NULL);
  return project_to_json (project, TRUE);
}

/* ------------------------------------------------------------------------------------------ */
/* JSON tree → text                                                                            */

static void
write_string (GString *out, const char *s)
{
  g_string_append_c (out, '"');
  for (const unsigned char *p = (const unsigned char *) s; *p; p++)
    {
      switch (*p)
        {
        case '"':
          g_string_append (out, "\\\"");
          break;
        case '\\':
          g_string_append (out, "\\\\");
          break;
        case '\n':
          g_string_append (out, "\\n");
          break;
        case '\r':
          g_string_append (out, "\\r");
          break;
        case '\t':
          g_string_append (out, "\\t");
          break;
        case '\b':
          g_string_append (out, "\\b");
          break;
        case '\f':
          g_string_append (out, "\\f");
          break;
        default:
          if (*p < 0x20)
            g_string_append_printf (out, "\\u%04x", *p);
          else
            g_string_append_c (out, (char) *p);
        }
    }
  g_string_append_c (out, '"');
}

static void
write_value (GString *out, JsonNode *n)
{
  GType t = json_node_get_value_type (n);
  if (t == G_TYPE_STRING)
    write_string (out, json_node_get_string (n));
  else if (t == G_TYPE_BOOLEAN)
    g_string_append (out, json_node_get_boolean (n) ? "true" : "false");
  else if (t == G_TYPE_INT64)
    g_string_append_printf (out, "%" G_GINT64_FORMAT, json_node_get_int (n));
  else
    {
      char buf[G_ASCII_DTOSTR_BUF_SIZE + 4];
      double v = json_node_get_double (n);
      if (!isfinite (v))
        {
          /* never reached through aw_project_save (validated first) */
          g_string_append (out, "null");
          return;
        }
      format_number (buf, G_ASCII_DTOSTR_BUF_SIZE, v);
      if (strpbrk (buf, ".eEn") == NULL)
        g_strlcat (buf, ".0", sizeof buf);   /* stays a floating-point number on reading */
      g_string_append (out, buf);
    }
}

static gboolean
is_scalar_array (JsonArray *a)
{
  guint n = json_array_get_length (a);
  for (guint i = 0; i < n; i++)
    {
      JsonNodeType t = json_node_get_node_type (json_array_get_element (a, i));
      if (t == JSON_NODE_OBJECT || t == JSON_NODE_ARRAY)
        return FALSE;
    }
  return TRUE;
}

static void
indent (GString *out, int level)
{
  for (int i = 0; i < level; i++)
    g_string_append (out, "  ");
}

static void
write_node (GString *out, JsonNode *n, int level)
{
  switch (json_node_get_node_type (n))
    {
    case JSON_NODE_NULL:
      g_string_append (out, "null");
      break;
    case JSON_NODE_VALUE:
      write_value (out, n);
      break;
    case JSON_NODE_ARRAY:
      {
        JsonArray *a = json_node_get_array (n);
        guint len = json_array_get_length (a);
        if (len == 0)
          {
            g_string_append (out, "[]");
            break;
          }
        gboolean inline_ = is_scalar_array (a);
        g_string_append_c (out, '[');
        for (guint i = 0; i < len; i++)
          {
            if (i > 0)
              g_string_append_c (out, ',');
            if (inline_)
              {
                if (i > 0)
                  g_string_append_c (out, ' ');
              }
            else
              {
                g_string_append_c (out, '\n');
                indent (out, level + 1);
              }
            write_node (out, json_array_get_element (a, i), level + 1);
          }
        if (!inline_)
          {
            g_string_append_c (out, '\n');
            indent (out, level);
          }
        g_string_append_c (out, ']');
        break;
      }
    case JSON_NODE_OBJECT:
    default:
      {
        JsonObject *o = json_node_get_object (n);
        GList *names = json_object_get_members (o);
        if (names == NULL)
          {
            g_string_append (out, "{}");
            break;
          }
        g_string_append_c (out, '{');
        for (GList *l = names; l != NULL; l = l->next)
          {
            g_string_append (out, l == names ? "\n" : ",\n");
            indent (out, level + 1);
            write_string (out, l->data);
            g_string_append (out, ": ");
            write_node (out, json_object_get_member (o, l->data), level + 1);
          }
        g_list_free (names);
        g_string_append_c (out, '\n');
        indent (out, level);
        g_string_append_c (out, '}');
        break;
      }
    }
}

static char *
node_to_text (JsonNode *root, gsize *length)
{
  GString *out = g_string_sized_new (4096);
  write_node (out, root, 0);
  g_string_append_c (out, '\n');
  if (length)
    *length = out->len;
  return g_string_free (out, FALSE);
}

char *
aw_project_to_data (const AwProject *project, gsize *length)
{
  g_return_val_if_fail (project != NULL, NULL);
  JsonNode *root = project_to_json (project, TRUE);
  char *text = node_to_text (root, length);
  json_node_unref (root);
  return text;
}

/* ------------------------------------------------------------------------------------------ */
/* validation of a model in memory                                                             */

static gboolean
validate_into (const AwProject *project, Ctx *ctx)
{
  /* The loader's rules applied to the tree the project would be written as (without the kept
   * rejected entries, which are written back unchanged); paths are the same as in the file.
   * The tree is checked directly, so a NaN in memory is reported at its path. */
  JsonNode *root = project_to_json (project, FALSE);
  guint before = ctx->count;
  AwProject *p = parse_project (ctx, root);
  json_node_unref (root);
  aw_project_free (p);
  return ctx->count == before;
}

gboolean
aw_project_validate (const AwProject *project, GPtrArray *problems)
{
  g_return_val_if_fail (project != NULL, FALSE);
  Ctx ctx = { problems ? g_ptr_array_ref (problems) : g_ptr_array_new_with_free_func (g_free),
              0, 0, NULL };
  gboolean ok = validate_into (project, &ctx);
  g_clear_error (&ctx.error);
  g_ptr_array_unref (ctx.problems);
  return ok;
}

guint
aw_project_recheck_rejected (AwProject *project, GPtrArray *problems)
{
  g_return_val_if_fail (project != NULL, 0);
  Ctx ctx = { problems ? g_ptr_array_ref (problems) : g_ptr_array_new_with_free_func (g_free),
              0, 0, NULL };
  for (guint i = 0; i < project->rejected->len;)
    {
      AwRejectedEntry *e = project->rejected->pdata[i];
      gboolean is_setup = g_strcmp0 (e->list, "setups") == 0;
      char *path = path_index (is_setup ? "setups" : "site_rules", e->index);
      guint before = ctx.count;
      gpointer entry = is_setup ? (gpointer) parse_setup (&ctx, e->raw, path)
                                : (gpointer) parse_site_rules (&ctx, e->raw, path);
      gboolean promoted = FALSE;
      if (entry != NULL && ctx.count == before)
        {
          GPtrArray *list = is_setup ? project->setups : project->site_rules;
          const char *name = is_setup ? ((AwSetup *) entry)->name : ((AwSiteRules *) entry)->name;
          gint other = -1;
          for (guint k = 0; k < list->len && other < 0; k++)
            {
              const char *kn = is_setup ? ((AwSetup *) list->pdata[k])->name
                                        : ((AwSiteRules *) list->pdata[k])->name;
              if (g_strcmp0 (kn, name) == 0)
                other = (gint) k;
            }
          if (other >= 0)
            {
              char *np = path_member (path, "name");
              char *q = quote_for_problem (name);
              problem_add (&ctx, np, "duplicate %s name %s (also %s[%d])",
                           is_setup ? "setup" : "site rules", q, e->list, other);
              g_free (q);
              g_free (np);
            }
          else
            {
              g_ptr_array_insert (list, (gint) MIN (e->index, list->len), entry);
              entry = NULL;
              promoted = TRUE;
            }
        }
      if (entry != NULL)
        {
          if (is_setup)
            aw_setup_free (entry);
          else
            aw_site_rules_free (entry);
        }
      g_free (path);
      if (promoted)
        g_ptr_array_remove_index (project->rejected, i);
      else
        i++;
    }
  g_clear_error (&ctx.error);
  g_ptr_array_unref (ctx.problems);
  return project->rejected->len;
}

/* ------------------------------------------------------------------------------------------ */
/* saving                                                                                      */

static AwSaveHook save_hook;
static gpointer save_hook_data;

void
aw_project_set_save_hook (AwSaveHook hook, gpointer user_data)
{
  save_hook = hook;
  save_hook_data = user_data;
}

static gboolean
hook_allows (AwSaveStage stage, gsize *limit)
{
  gsize dummy = G_MAXSIZE;
  return save_hook == NULL || save_hook (stage, limit ? limit : &dummy, save_hook_data);
}

char *
aw_project_backup_path (const char *path)
{
  g_return_val_if_fail (path != NULL, NULL);
  return g_strconcat (path, "~", NULL);
}

static gboolean
set_io_error (GError **error, const char *what, const char *file, int errsv)
{
  g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_IO, "%s %s: %s", what, file,
               g_strerror (errsv));
  return FALSE;
}

static gboolean
write_all (int fd, const char *data, gsize len)
{
  while (len > 0)
    {
      ssize_t n = write (fd, data, len);
      if (n < 0)
        {
          if (errno == EINTR)
            continue;
          return FALSE;
        }
      data += n;
      len -= (gsize) n;
    }
  return TRUE;
}

/* Copies the previous file to PATH~ through a temporary file and a rename, so the backup is
 * complete or absent, never half-written. */
static gboolean
make_backup (const char *path, GError **error)
{
  if (!g_file_test (path, G_FILE_TEST_EXISTS))
    return TRUE;
  char *old = NULL;
  gsize len = 0;
  GError *e = NULL;
  if (!g_file_get_contents (path, &old, &len, &e))
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_IO, "reading the previous file: %s",
                   e->message);
      g_error_free (e);
      return FALSE;
    }
  char *backup = aw_project_backup_path (path);
  gboolean ok = g_file_set_contents_full (backup, old, (gssize) len,
                                          G_FILE_SET_CONTENTS_CONSISTENT, 0644, &e);
  if (!ok)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_IO, "writing the backup %s: %s", backup,
                   e->message);
      g_error_free (e);
    }
  g_free (backup);
  g_free (old);
  return ok;
}

gboolean
aw_project_save (const AwProject *project, const char *path, GError **error)
{
  g_return_val_if_fail (project != NULL && path != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  GPtrArray *problems = g_ptr_array_new_with_free_func (g_free);
  if (!aw_project_validate (project, problems))
    {
      if (problems->len > 1)
        g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID, "%s (and %u more problems)",
                     (char *) problems->pdata[0], problems->len - 1);
      else
        g_set_error_literal (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                             problems->len ? problems->pdata[0] : "invalid project");
      g_ptr_array_unref (problems);
      return FALSE;
    }
  g_ptr_array_unref (problems);

  gsize len = 0;
  char *text = aw_project_to_data (project, &len);
  char *tmp = g_strconcat (path, ".tmp-XXXXXX", NULL);
  gboolean ok = FALSE;
  int fd = -1;

  if (!hook_allows (AW_SAVE_STAGE_OPEN_TEMP, NULL))
    {
      set_io_error (error, "creating", tmp, EACCES);
      goto out_no_temp;
    }
  fd = g_mkstemp_full (tmp, O_WRONLY | O_CREAT | O_EXCL, 0644);
  if (fd < 0)
    {
      set_io_error (error, "creating", tmp, errno);
      goto out_no_temp;
    }

  gsize limit = len;
  gboolean write_ok = hook_allows (AW_SAVE_STAGE_WRITE, &limit);
  if (!write_all (fd, text, MIN (limit, len)) || !write_ok || limit < len)
    {
      set_io_error (error, "writing", tmp, write_ok && limit >= len ? errno : ENOSPC);
      goto out;
    }
  if (!hook_allows (AW_SAVE_STAGE_SYNC, NULL) || fsync (fd) != 0)
    {
      set_io_error (error, "flushing", tmp, errno ? errno : EIO);
      goto out;
    }
  if (close (fd) != 0)
    {
      fd = -1;
      set_io_error (error, "closing", tmp, errno);
      goto out;
    }
  fd = -1;

  /* read back what is on the disk and compare with the project in memory */
  {
    char *back = NULL;
    gsize back_len = 0;
    GError *e = NULL;
    gboolean same = FALSE, same_bytes = FALSE;
    if (hook_allows (AW_SAVE_STAGE_VERIFY, NULL)
        && g_file_get_contents (tmp, &back, &back_len, &e))
      {
        AwProject *re = aw_project_load_data (back, (gssize) back_len, AW_PROJECT_LOAD_LENIENT,
                                              NULL, NULL);
        same_bytes = back_len == len && memcmp (back, text, len) == 0;
        same = same_bytes && re != NULL && aw_project_equal (re, project);
        aw_project_free (re);
        g_free (back);
      }
    g_clear_error (&e);
    if (!same)
      {
        if (same_bytes)
          g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                       "verifying %s: the text does not read back as the same project "
                       "(a kept invalid entry now reads differently: re-check the kept "
                       "entries)", tmp);
        else
          g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_IO,
                       "verifying %s: the file read back differs from what was written", tmp);
        goto out;
      }
  }

  if (!hook_allows (AW_SAVE_STAGE_BACKUP, NULL))
    {
      set_io_error (error, "writing the backup of", path, EACCES);
      goto out;
    }
  if (!make_backup (path, error))
    goto out;

  if (!hook_allows (AW_SAVE_STAGE_RENAME, NULL))
    {
      set_io_error (error, "renaming over", path, EACCES);
      goto out;
    }
  if (g_rename (tmp, path) != 0)
    {
      set_io_error (error, "renaming over", path, errno);
      goto out;
    }
  ok = TRUE;

  /* make the rename itself durable */
  {
    char *dir = g_path_get_dirname (path);
    int dfd = open (dir, O_RDONLY | O_DIRECTORY);
    if (dfd >= 0)
      {
        fsync (dfd);
        close (dfd);
      }
    g_free (dir);
  }

out:
  if (fd >= 0)
    close (fd);
  if (!ok)
    g_unlink (tmp);
out_no_temp:
  g_free (tmp);
  g_free (text);
  return ok;
}
