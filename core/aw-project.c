/* aw-project.c: the project data model
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>

#include "aw-project.h"
#include "aw-project-private.h"
#include "aw-units.h"

/* ---- JSON helpers (deep copy and value equality of unknown members) ---- */

static JsonObject *json_object_deep_copy (JsonObject *o);

JsonNode *
aw_json_node_deep_copy (JsonNode *node)
{
  if (node == NULL)
    return NULL;
  switch (json_node_get_node_type (node))
    {
    case JSON_NODE_OBJECT:
      {
        JsonNode *n = json_node_new (JSON_NODE_OBJECT);
        json_node_take_object (n, json_object_deep_copy (json_node_get_object (node)));
        return n;
      }
    case JSON_NODE_ARRAY:
      {
        JsonArray *src = json_node_get_array (node);
        guint len = json_array_get_length (src);
        JsonArray *dst = json_array_sized_new (len);
        for (guint i = 0; i < len; i++)
          json_array_add_element (dst, aw_json_node_deep_copy (json_array_get_element (src, i)));
        JsonNode *n = json_node_new (JSON_NODE_ARRAY);
        json_node_take_array (n, dst);
        return n;
      }
    case JSON_NODE_VALUE:
    case JSON_NODE_NULL:
    default:
      {
        JsonNode *n = json_node_copy (node);
        return n;
      }
    }
}

static JsonObject *
json_object_deep_copy (JsonObject *o)
{
  JsonObject *dst = json_object_new ();
  GList *names = json_object_get_members (o);   /* in file order */
  for (GList *l = names; l != NULL; l = l->next)
    json_object_set_member (dst, l->data,
                            aw_json_node_deep_copy (json_object_get_member (o, l->data)));
  g_list_free (names);
  return dst;
}

JsonObject *
aw_json_object_copy_or_null (JsonObject *o)
{
  if (o == NULL)
    return NULL;
  return json_object_deep_copy (o);
}

static bool
json_value_equal (JsonNode *a, JsonNode *b)
{
  GType ta = json_node_get_value_type (a);
  GType tb = json_node_get_value_type (b);
  if (ta == G_TYPE_STRING || tb == G_TYPE_STRING)
    return ta == tb && g_strcmp0 (json_node_get_string (a), json_node_get_string (b)) == 0;
  if (ta == G_TYPE_BOOLEAN || tb == G_TYPE_BOOLEAN)
    return ta == tb && json_node_get_boolean (a) == json_node_get_boolean (b);
  if (ta == G_TYPE_INT64 && tb == G_TYPE_INT64)
    return json_node_get_int (a) == json_node_get_int (b);
  /* numbers of mixed kinds compare by value */
  double da = ta == G_TYPE_INT64 ? (double) json_node_get_int (a) : json_node_get_double (a);
  double db = tb == G_TYPE_INT64 ? (double) json_node_get_int (b) : json_node_get_double (b);
  return da == db || (isnan (da) && isnan (db));
}

bool
aw_json_node_equal (JsonNode *a, JsonNode *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  JsonNodeType ta = json_node_get_node_type (a);
  if (ta != json_node_get_node_type (b))
    return false;
  switch (ta)
    {
    case JSON_NODE_NULL:
      return true;
    case JSON_NODE_VALUE:
      return json_value_equal (a, b);
    case JSON_NODE_ARRAY:
      {
        JsonArray *aa = json_node_get_array (a), *ab = json_node_get_array (b);
        guint len = json_array_get_length (aa);
        if (len != json_array_get_length (ab))
          return false;
        for (guint i = 0; i < len; i++)
          if (!aw_json_node_equal (json_array_get_element (aa, i), json_array_get_element (ab, i)))
            return false;
        return true;
      }
    case JSON_NODE_OBJECT:
    default:
      return aw_json_object_equal (json_node_get_object (a), json_node_get_object (b));
    }
}

/* NULL and an empty object are the same (no unknown members). */
bool
aw_json_object_equal (JsonObject *a, JsonObject *b)
{
  guint na = a ? json_object_get_size (a) : 0;
  guint nb = b ? json_object_get_size (b) : 0;
  if (na != nb)
    return false;
  if (na == 0)
    return true;
  JsonObjectIter it;
  const char *name;
  JsonNode *member;
  json_object_iter_init (&it, a);
  while (json_object_iter_next (&it, &name, &member))
    {
      JsonNode *other = json_object_get_member (b, name);
      if (other == NULL || !aw_json_node_equal (member, other))
        return false;
    }
  return true;
}

static void
clear_extra (JsonObject **o)
{
  g_clear_pointer (o, json_object_unref);
}

static bool
num_eq (double a, double b)
{
  return a == b || (isnan (a) && isnan (b));
}

static bool
str_eq (const char *a, const char *b)
{
  return g_strcmp0 (a, b) == 0;
}

/* ---- conditions ---- */

void
aw_project_conditions_init (AwProjectConditions *c)
{
  g_return_if_fail (c != NULL);
  c->temperature_c = 15.0;
  c->pressure_hpa = 1013.25;
  c->altitude_m = NAN;
  c->humidity_pct = 50.0;
  c->wind_speed_mps = 0.0;
  c->wind_from_deg = 90.0;
  c->extra = NULL;
}

void
aw_project_conditions_clear (AwProjectConditions *c)
{
  if (c == NULL)
    return;
  clear_extra (&c->extra);
}

AwProjectConditions *
aw_project_conditions_new (void)
{
  AwProjectConditions *c = g_new0 (AwProjectConditions, 1);
  aw_project_conditions_init (c);
  return c;
}

void
aw_project_conditions_copy_into (AwProjectConditions *dst, const AwProjectConditions *src)
{
  g_return_if_fail (dst != NULL && src != NULL);
  if (dst == src)
    return;
  aw_project_conditions_clear (dst);
  *dst = *src;
  dst->extra = aw_json_object_copy_or_null (src->extra);
}

AwProjectConditions *
aw_project_conditions_copy (const AwProjectConditions *c)
{
  if (c == NULL)
    return NULL;
  AwProjectConditions *d = g_new0 (AwProjectConditions, 1);
  aw_project_conditions_copy_into (d, c);
  return d;
}

void
aw_project_conditions_free (AwProjectConditions *c)
{
  if (c == NULL)
    return;
  aw_project_conditions_clear (c);
  g_free (c);
}

bool
aw_project_conditions_equal (const AwProjectConditions *a, const AwProjectConditions *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  return num_eq (a->temperature_c, b->temperature_c)
         && num_eq (a->pressure_hpa, b->pressure_hpa)
         && num_eq (a->altitude_m, b->altitude_m)
         && num_eq (a->humidity_pct, b->humidity_pct)
         && num_eq (a->wind_speed_mps, b->wind_speed_mps)
         && num_eq (a->wind_from_deg, b->wind_from_deg)
         && aw_json_object_equal (a->extra, b->extra);
}

/* ---- chrono strings ---- */

AwChronoString *
aw_chrono_string_new (void)
{
  AwChronoString *c = g_new0 (AwChronoString, 1);
  c->bb_mass_g = 0.20;
  c->hop = AW_CHRONO_HOP_UNSPECIFIED;
  c->unit = AW_VELOCITY_UNIT_MPS;
  c->velocities = g_array_new (FALSE, FALSE, sizeof (double));
  c->temperature_c = NAN;
  c->date = NULL;
  c->note = g_strdup ("");
  return c;
}

AwChronoString *
aw_chrono_string_copy (const AwChronoString *c)
{
  if (c == NULL)
    return NULL;
  AwChronoString *d = g_new0 (AwChronoString, 1);
  *d = *c;
  d->velocities = g_array_sized_new (FALSE, FALSE, sizeof (double), c->velocities->len);
  g_array_append_vals (d->velocities, c->velocities->data, c->velocities->len);
  d->date = g_strdup (c->date);
  d->note = g_strdup (c->note);
  d->extra = aw_json_object_copy_or_null (c->extra);
  return d;
}

void
aw_chrono_string_free (AwChronoString *c)
{
  if (c == NULL)
    return;
  g_array_unref (c->velocities);
  g_free (c->date);
  g_free (c->note);
  clear_extra (&c->extra);
  g_free (c);
}

bool
aw_chrono_string_equal (const AwChronoString *a, const AwChronoString *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  if (!(num_eq (a->bb_mass_g, b->bb_mass_g) && a->hop == b->hop && a->unit == b->unit
        && num_eq (a->temperature_c, b->temperature_c) && str_eq (a->date, b->date)
        && str_eq (a->note, b->note) && a->velocities->len == b->velocities->len
        && aw_json_object_equal (a->extra, b->extra)))
    return false;
  for (guint i = 0; i < a->velocities->len; i++)
    if (!num_eq (g_array_index (a->velocities, double, i),
                 g_array_index (b->velocities, double, i)))
      return false;
  return true;
}

void
aw_chrono_string_add (AwChronoString *c, double velocity)
{
  g_return_if_fail (c != NULL);
  g_array_append_val (c->velocities, velocity);
}

double
aw_chrono_string_velocity_mps (const AwChronoString *c, guint i)
{
  g_return_val_if_fail (c != NULL && i < c->velocities->len, NAN);
  double v = g_array_index (c->velocities, double, i);
  return c->unit == AW_VELOCITY_UNIT_FPS ? aw_fps_to_mps (v) : v;
}

bool
aw_chrono_string_stats (const AwChronoString *c, AwChronoStats *stats)
{
  g_return_val_if_fail (stats != NULL, false);
  stats->n = 0;
  stats->mean_mps = stats->min_mps = stats->max_mps = NAN;
  stats->sd_mps = stats->es_mps = NAN;
  stats->energy_mean_j = stats->energy_max_j = NAN;
  if (c == NULL || c->velocities->len == 0)
    return false;

  guint n = c->velocities->len;
  double lo = INFINITY, hi = -INFINITY;
  /* Welford's running mean and sum of squared deviations */
  double mean = 0.0, m2 = 0.0;
  for (guint i = 0; i < n; i++)
    {
      double v = aw_chrono_string_velocity_mps (c, i);
      if (!isfinite (v))
        return false;
      double d = v - mean;
      mean += d / (double) (i + 1);
      m2 += d * (v - mean);
      lo = MIN (lo, v);
      hi = MAX (hi, v);
    }
  double mass_kg = aw_g_to_kg (c->bb_mass_g);
  stats->n = n;
  stats->mean_mps = mean;
  stats->min_mps = lo;
  stats->max_mps = hi;
  stats->sd_mps = n >= 2 ? sqrt (m2 / (double) (n - 1)) : NAN;
  stats->es_mps = hi - lo;
  if (isfinite (mass_kg) && mass_kg > 0.0)
    {
      stats->energy_mean_j = aw_energy_j (mass_kg, mean);
      stats->energy_max_j = aw_energy_j (mass_kg, hi);
    }
  return true;
}

/* ---- observations ---- */

AwObservation *
aw_observation_new (void)
{
  AwObservation *o = g_new0 (AwObservation, 1);
  o->kind = AW_OBSERVATION_HEIGHT;
  o->distance_m = 20.0;
  o->height_cm = 0.0;
  o->note = g_strdup ("");
  return o;
}

AwObservation *
aw_observation_copy (const AwObservation *o)
{
  if (o == NULL)
    return NULL;
  AwObservation *d = g_new0 (AwObservation, 1);
  *d = *o;
  d->note = g_strdup (o->note);
  d->extra = aw_json_object_copy_or_null (o->extra);
  return d;
}

void
aw_observation_free (AwObservation *o)
{
  if (o == NULL)
    return;
  g_free (o->note);
  clear_extra (&o->extra);
  g_free (o);
}

bool
aw_observation_equal (const AwObservation *a, const AwObservation *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  return a->kind == b->kind && num_eq (a->distance_m, b->distance_m)
         && num_eq (a->height_cm, b->height_cm) && str_eq (a->note, b->note)
         && aw_json_object_equal (a->extra, b->extra);
}

/* ---- setup ---- */

static void
replica_point_clear (gpointer data)
{
  AwReplicaPoint *p = data;
  g_clear_pointer (&p->extra, json_object_unref);
}

GArray *
aw_replica_points_new (void)
{
  GArray *a = g_array_new (FALSE, TRUE, sizeof (AwReplicaPoint));
  g_array_set_clear_func (a, replica_point_clear);
  return a;
}

static void
replica_init (AwReplica *r)
{
  r->type = g_strdup ("");
  r->power_source = AW_POWER_SOURCE_ELECTRIC_PISTON;
  r->energy_model = AW_POWER_CONSTANT_ENERGY;
  r->creep_pct_per_01g = 0.0;
  r->points = aw_replica_points_new ();
  r->ref_mass_g = 0.20;
  r->ref_velocity_mps = 100.0;
  r->extra = NULL;
  r->reference_extra = NULL;
  r->curve_points = NULL;
}

static void
replica_clear (AwReplica *r)
{
  g_clear_pointer (&r->type, g_free);
  g_clear_pointer (&r->points, g_array_unref);
  g_clear_pointer (&r->curve_points, g_array_unref);
  clear_extra (&r->extra);
  clear_extra (&r->reference_extra);
}

static void
replica_copy_into (AwReplica *d, const AwReplica *s)
{
  *d = *s;
  d->type = g_strdup (s->type);
  d->points = aw_replica_points_new ();
  for (guint i = 0; i < s->points->len; i++)
    {
      AwReplicaPoint pt = g_array_index (s->points, AwReplicaPoint, i);
      pt.extra = aw_json_object_copy_or_null (pt.extra);
      g_array_append_val (d->points, pt);
    }
  d->curve_points = NULL;
  d->extra = aw_json_object_copy_or_null (s->extra);
  d->reference_extra = aw_json_object_copy_or_null (s->reference_extra);
}

static bool
replica_equal (const AwReplica *a, const AwReplica *b)
{
  if (!(str_eq (a->type, b->type) && a->power_source == b->power_source
        && a->energy_model == b->energy_model
        && num_eq (a->creep_pct_per_01g, b->creep_pct_per_01g)
        && num_eq (a->ref_mass_g, b->ref_mass_g)
        && num_eq (a->ref_velocity_mps, b->ref_velocity_mps)
        && a->points->len == b->points->len
        && aw_json_object_equal (a->extra, b->extra)
        && aw_json_object_equal (a->reference_extra, b->reference_extra)))
    return false;
  for (guint i = 0; i < a->points->len; i++)
    {
      const AwReplicaPoint *pa = &g_array_index (a->points, AwReplicaPoint, i);
      const AwReplicaPoint *pb = &g_array_index (b->points, AwReplicaPoint, i);
      if (!num_eq (pa->mass_g, pb->mass_g) || !num_eq (pa->velocity_mps, pb->velocity_mps)
          || !aw_json_object_equal (pa->extra, pb->extra))
        return false;
    }
  return true;
}

AwSetup *
aw_setup_new (const char *name)
{
  AwSetup *s = g_new0 (AwSetup, 1);
  s->name = g_strdup (name ? name : "");
  s->colour = g_strdup ("#3465a4");
  s->notes = g_strdup ("");
  s->visible = true;
  replica_init (&s->replica);
  s->bb.mass_g = 0.20;
  s->bb.diameter_mm = 5.95;
  s->hop.mode = AW_HOP_MODE_AUTO;
  s->hop.value = 0.0;
  s->hop.tilt_deg = 0.0;
  s->hop.max_lift_ratio = NAN;
  s->sighting.sight_height_m = 0.07;
  s->sighting.zero_distance_m = NAN;
  s->sighting.angle_unit = AW_ANGLE_MRAD;
  s->muzzle_height_m = 1.5;
  s->band_half_height_m = AW_BAND_HALF_DEFAULT_M;
  s->model.drag = AW_DRAG_CLIFT;
  s->model.drag_cd = 0.47;
  s->model.lift = AW_LIFT_SATURATING;
  s->model.lift_slope = AW_LIFT_TRADE_SLOPE;
  s->model.lift_factor = 1.0;
  s->model.drag_factor = 1.0;
  s->model.spin_decay_factor = 1.0;
  s->conditions = NULL;
  s->chrono = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_chrono_string_free);
  s->observations = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_observation_free);
  return s;
}

AwSetup *
aw_setup_copy (const AwSetup *s)
{
  if (s == NULL)
    return NULL;
  AwSetup *d = g_new0 (AwSetup, 1);
  *d = *s;
  d->name = g_strdup (s->name);
  d->colour = g_strdup (s->colour);
  d->notes = g_strdup (s->notes);
  replica_copy_into (&d->replica, &s->replica);
  d->bb.extra = aw_json_object_copy_or_null (s->bb.extra);
  d->hop.extra = aw_json_object_copy_or_null (s->hop.extra);
  d->sighting.extra = aw_json_object_copy_or_null (s->sighting.extra);
  d->model.extra = aw_json_object_copy_or_null (s->model.extra);
  d->conditions = aw_project_conditions_copy (s->conditions);
  d->chrono = g_ptr_array_new_full (s->chrono->len, (GDestroyNotify) aw_chrono_string_free);
  for (guint i = 0; i < s->chrono->len; i++)
    g_ptr_array_add (d->chrono, aw_chrono_string_copy (s->chrono->pdata[i]));
  d->observations = g_ptr_array_new_full (s->observations->len,
                                          (GDestroyNotify) aw_observation_free);
  for (guint i = 0; i < s->observations->len; i++)
    g_ptr_array_add (d->observations, aw_observation_copy (s->observations->pdata[i]));
  d->extra = aw_json_object_copy_or_null (s->extra);
  return d;
}

void
aw_setup_free (AwSetup *s)
{
  if (s == NULL)
    return;
  g_free (s->name);
  g_free (s->colour);
  g_free (s->notes);
  replica_clear (&s->replica);
  clear_extra (&s->bb.extra);
  clear_extra (&s->hop.extra);
  clear_extra (&s->sighting.extra);
  clear_extra (&s->model.extra);
  aw_project_conditions_free (s->conditions);
  g_ptr_array_unref (s->chrono);
  g_ptr_array_unref (s->observations);
  clear_extra (&s->extra);
  g_free (s);
}

bool
aw_setup_equal (const AwSetup *a, const AwSetup *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  if (!(str_eq (a->name, b->name) && str_eq (a->colour, b->colour) && str_eq (a->notes, b->notes)
        && a->visible == b->visible && replica_equal (&a->replica, &b->replica)))
    return false;
  if (!(num_eq (a->bb.mass_g, b->bb.mass_g) && num_eq (a->bb.diameter_mm, b->bb.diameter_mm)
        && aw_json_object_equal (a->bb.extra, b->bb.extra)))
    return false;
  if (!(a->hop.mode == b->hop.mode && num_eq (a->hop.value, b->hop.value)
        && num_eq (a->hop.tilt_deg, b->hop.tilt_deg)
        && num_eq (a->hop.max_lift_ratio, b->hop.max_lift_ratio)
        && aw_json_object_equal (a->hop.extra, b->hop.extra)))
    return false;
  if (!(num_eq (a->sighting.sight_height_m, b->sighting.sight_height_m)
        && num_eq (a->sighting.zero_distance_m, b->sighting.zero_distance_m)
        && a->sighting.angle_unit == b->sighting.angle_unit
        && aw_json_object_equal (a->sighting.extra, b->sighting.extra)))
    return false;
  if (!(num_eq (a->muzzle_height_m, b->muzzle_height_m)
        && num_eq (a->band_half_height_m, b->band_half_height_m)))
    return false;
  const AwModelChoice *ma = &a->model, *mb = &b->model;
  if (!(ma->drag == mb->drag && num_eq (ma->drag_cd, mb->drag_cd) && ma->lift == mb->lift
        && num_eq (ma->lift_slope, mb->lift_slope) && num_eq (ma->lift_factor, mb->lift_factor)
        && num_eq (ma->drag_factor, mb->drag_factor)
        && num_eq (ma->spin_decay_factor, mb->spin_decay_factor)
        && aw_json_object_equal (ma->extra, mb->extra)))
    return false;
  if (!aw_project_conditions_equal (a->conditions, b->conditions))
    return false;
  if (a->chrono->len != b->chrono->len || a->observations->len != b->observations->len)
    return false;
  for (guint i = 0; i < a->chrono->len; i++)
    if (!aw_chrono_string_equal (a->chrono->pdata[i], b->chrono->pdata[i]))
      return false;
  for (guint i = 0; i < a->observations->len; i++)
    if (!aw_observation_equal (a->observations->pdata[i], b->observations->pdata[i]))
      return false;
  return aw_json_object_equal (a->extra, b->extra);
}

/* ---- site rules ---- */

AwSiteClassRule *
aw_site_class_rule_new (const char *name)
{
  AwSiteClassRule *r = g_new0 (AwSiteClassRule, 1);
  r->name = g_strdup (name ? name : "");
  r->energy_limit_j = 1.0;
  r->chrono_bb_mass_g = 0.20;
  r->hop_rule = g_strdup ("");
  r->min_engagement_m = 0.0;
  return r;
}

AwSiteClassRule *
aw_site_class_rule_copy (const AwSiteClassRule *r)
{
  if (r == NULL)
    return NULL;
  AwSiteClassRule *d = g_new0 (AwSiteClassRule, 1);
  *d = *r;
  d->name = g_strdup (r->name);
  d->hop_rule = g_strdup (r->hop_rule);
  d->extra = aw_json_object_copy_or_null (r->extra);
  return d;
}

void
aw_site_class_rule_free (AwSiteClassRule *r)
{
  if (r == NULL)
    return;
  g_free (r->name);
  g_free (r->hop_rule);
  clear_extra (&r->extra);
  g_free (r);
}

bool
aw_site_class_rule_equal (const AwSiteClassRule *a, const AwSiteClassRule *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  return str_eq (a->name, b->name) && num_eq (a->energy_limit_j, b->energy_limit_j)
         && num_eq (a->chrono_bb_mass_g, b->chrono_bb_mass_g) && str_eq (a->hop_rule, b->hop_rule)
         && num_eq (a->min_engagement_m, b->min_engagement_m)
         && aw_json_object_equal (a->extra, b->extra);
}

AwSiteRules *
aw_site_rules_new (const char *name)
{
  AwSiteRules *r = g_new0 (AwSiteRules, 1);
  r->name = g_strdup (name ? name : "");
  r->notes = g_strdup ("");
  r->classes = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_site_class_rule_free);
  return r;
}

AwSiteRules *
aw_site_rules_copy (const AwSiteRules *r)
{
  if (r == NULL)
    return NULL;
  AwSiteRules *d = g_new0 (AwSiteRules, 1);
  d->name = g_strdup (r->name);
  d->notes = g_strdup (r->notes);
  d->classes = g_ptr_array_new_full (r->classes->len, (GDestroyNotify) aw_site_class_rule_free);
  for (guint i = 0; i < r->classes->len; i++)
    g_ptr_array_add (d->classes, aw_site_class_rule_copy (r->classes->pdata[i]));
  d->extra = aw_json_object_copy_or_null (r->extra);
  return d;
}

void
aw_site_rules_free (AwSiteRules *r)
{
  if (r == NULL)
    return;
  g_free (r->name);
  g_free (r->notes);
  g_ptr_array_unref (r->classes);
  clear_extra (&r->extra);
  g_free (r);
}

bool
aw_site_rules_equal (const AwSiteRules *a, const AwSiteRules *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  if (!(str_eq (a->name, b->name) && str_eq (a->notes, b->notes)
        && a->classes->len == b->classes->len && aw_json_object_equal (a->extra, b->extra)))
    return false;
  for (guint i = 0; i < a->classes->len; i++)
    if (!aw_site_class_rule_equal (a->classes->pdata[i], b->classes->pdata[i]))
      return false;
  return true;
}

/* ---- rejected entries ---- */

AwRejectedEntry *
aw_rejected_entry_new (const char *list, guint index, const char *name, JsonNode *raw)
{
  AwRejectedEntry *e = g_new0 (AwRejectedEntry, 1);
  e->list = g_strdup (list);
  e->index = index;
  e->name = g_strdup (name);
  e->raw = raw ? aw_json_node_deep_copy (raw) : json_node_new (JSON_NODE_NULL);
  return e;
}

void
aw_rejected_entry_free (AwRejectedEntry *e)
{
  if (e == NULL)
    return;
  g_free (e->list);
  g_free (e->name);
  json_node_unref (e->raw);
  g_free (e);
}

static AwRejectedEntry *
rejected_entry_copy (const AwRejectedEntry *e)
{
  return aw_rejected_entry_new (e->list, e->index, e->name, e->raw);
}

static bool
rejected_entry_equal (const AwRejectedEntry *a, const AwRejectedEntry *b)
{
  /* index is where the entry stood in the file it came from; the order of the list and the
   * content are what a save must keep */
  return str_eq (a->list, b->list) && str_eq (a->name, b->name)
         && aw_json_node_equal (a->raw, b->raw);
}

/* ---- project ---- */

AwProject *
aw_project_new (void)
{
  AwProject *p = g_new0 (AwProject, 1);
  p->name = g_strdup ("");
  p->notes = g_strdup ("");
  aw_project_conditions_init (&p->conditions);
  p->site_rules = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_site_rules_free);
  p->setups = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_setup_free);
  p->rejected = g_ptr_array_new_with_free_func ((GDestroyNotify) aw_rejected_entry_free);
  return p;
}

AwProject *
aw_project_copy (const AwProject *p)
{
  if (p == NULL)
    return NULL;
  AwProject *d = g_new0 (AwProject, 1);
  d->name = g_strdup (p->name);
  d->notes = g_strdup (p->notes);
  aw_project_conditions_copy_into (&d->conditions, &p->conditions);
  d->site_rules = g_ptr_array_new_full (p->site_rules->len, (GDestroyNotify) aw_site_rules_free);
  for (guint i = 0; i < p->site_rules->len; i++)
    g_ptr_array_add (d->site_rules, aw_site_rules_copy (p->site_rules->pdata[i]));
  d->setups = g_ptr_array_new_full (p->setups->len, (GDestroyNotify) aw_setup_free);
  for (guint i = 0; i < p->setups->len; i++)
    g_ptr_array_add (d->setups, aw_setup_copy (p->setups->pdata[i]));
  d->rejected = g_ptr_array_new_full (p->rejected->len,
                                      (GDestroyNotify) aw_rejected_entry_free);
  for (guint i = 0; i < p->rejected->len; i++)
    g_ptr_array_add (d->rejected, rejected_entry_copy (p->rejected->pdata[i]));
  d->extra = aw_json_object_copy_or_null (p->extra);
  return d;
}

void
aw_project_free (AwProject *p)
{
  if (p == NULL)
    return;
  g_free (p->name);
  g_free (p->notes);
  aw_project_conditions_clear (&p->conditions);
  g_ptr_array_unref (p->site_rules);
  g_ptr_array_unref (p->setups);
  g_ptr_array_unref (p->rejected);
  clear_extra (&p->extra);
  g_free (p);
}

bool
aw_project_equal (const AwProject *a, const AwProject *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  if (!(str_eq (a->name, b->name) && str_eq (a->notes, b->notes)
        && aw_project_conditions_equal (&a->conditions, &b->conditions)
        && a->site_rules->len == b->site_rules->len && a->setups->len == b->setups->len
        && a->rejected->len == b->rejected->len && aw_json_object_equal (a->extra, b->extra)))
    return false;
  for (guint i = 0; i < a->site_rules->len; i++)
    if (!aw_site_rules_equal (a->site_rules->pdata[i], b->site_rules->pdata[i]))
      return false;
  for (guint i = 0; i < a->setups->len; i++)
    if (!aw_setup_equal (a->setups->pdata[i], b->setups->pdata[i]))
      return false;
  for (guint i = 0; i < a->rejected->len; i++)
    if (!rejected_entry_equal (a->rejected->pdata[i], b->rejected->pdata[i]))
      return false;
  return true;
}

AwSetup *
aw_project_find_setup (const AwProject *p, const char *name)
{
  g_return_val_if_fail (p != NULL && name != NULL, NULL);
  for (guint i = 0; i < p->setups->len; i++)
    {
      AwSetup *s = p->setups->pdata[i];
      if (g_strcmp0 (s->name, name) == 0)
        return s;
    }
  return NULL;
}

AwSiteRules *
aw_project_find_site_rules (const AwProject *p, const char *name)
{
  g_return_val_if_fail (p != NULL && name != NULL, NULL);
  for (guint i = 0; i < p->site_rules->len; i++)
    {
      AwSiteRules *r = p->site_rules->pdata[i];
      if (g_strcmp0 (r->name, name) == 0)
        return r;
    }
  return NULL;
}

/* ---- enum names ---- */

static const char *const power_source_names[] = {
  "spring", "electric_piston", "gas", "hpa", "co2",
};
static const char *const energy_model_names[] = {
  "constant_energy", "constant_velocity", "creep", "measured",
};
static const char *const hop_mode_names[] = { "auto", "lift_ratio", "spin_rpm" };
static const char *const angle_unit_names[] = { "mrad", "moa" };
static const char *const drag_names[] = { "clift", "morrison", "constant", "off" };
static const char *const lift_names[] = { "saturating", "shs", "loth", "linear", "off" };

static const char *
name_of (const char *const *names, guint n, int v)
{
  return v >= 0 && (guint) v < n ? names[v] : NULL;
}

static bool
value_of (const char *const *names, guint n, const char *name, int *out)
{
  if (name == NULL)
    return false;
  for (guint i = 0; i < n; i++)
    if (strcmp (names[i], name) == 0)
      {
        *out = (int) i;
        return true;
      }
  return false;
}

#define ENUM_NAMES(fn_to, fn_from, Type, names)                              \
  const char *fn_to (Type v)                                                 \
  {                                                                          \
    return name_of (names, G_N_ELEMENTS (names), (int) v);                   \
  }                                                                          \
  bool fn_from (const char *name, Type *out)                                 \
  {                                                                          \
    int v;                                                                   \
    if (!value_of (names, G_N_ELEMENTS (names), name, &v))                   \
      return false;                                                          \
    *out = (Type) v;                                                         \
    return true;                                                             \
  }

ENUM_NAMES (aw_power_source_to_name, aw_power_source_from_name, AwPowerSource, power_source_names)
ENUM_NAMES (aw_energy_model_to_name, aw_energy_model_from_name, AwPowerModel, energy_model_names)
ENUM_NAMES (aw_hop_mode_to_name, aw_hop_mode_from_name, AwHopMode, hop_mode_names)
ENUM_NAMES (aw_angle_unit_to_name, aw_angle_unit_from_name, AwAngleUnit, angle_unit_names)
ENUM_NAMES (aw_drag_model_to_name, aw_drag_model_from_name, AwDragModel, drag_names)
ENUM_NAMES (aw_lift_model_to_name, aw_lift_model_from_name, AwLiftModel, lift_names)

G_STATIC_ASSERT (G_N_ELEMENTS (power_source_names) == AW_N_POWER_SOURCES);
G_STATIC_ASSERT (G_N_ELEMENTS (drag_names) == AW_N_DRAG_MODELS);
G_STATIC_ASSERT (G_N_ELEMENTS (lift_names) == AW_N_LIFT_MODELS);
