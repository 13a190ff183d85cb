/* df-loop-item.c: one loop of the project and its measurement state (see df-loop-item.h).
 * No geometry here: the result comes from df-work.c. */
#include <gio/gio.h>

#include "df-format.h"
#include "df-loop-item.h"
#include "df-work.h"

struct _DfLoopItem
{
  GObject parent_instance;

  /* owned */
  guint           id;
  char           *name;
  char           *colour;
  gboolean        show_frames;
  double        (*uv)[2];
  gsize           n;
  df_shear_setup  drape;
  DfLoopState     state;
  df_loop_result *result;
  char           *error;
  char           *summary;
  char           *off_surface;   /* why the loop does not lie on the surface, or NULL */
  GCancellable   *cancellable;
};

G_DEFINE_FINAL_TYPE (DfLoopItem, df_loop_item, G_TYPE_OBJECT)

enum
{
  PROP_0,
  PROP_NAME,
  PROP_COLOUR,
  PROP_SHOW_FRAMES,
  PROP_STATE,
  PROP_SUMMARY,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

static guint next_id = 1;

static void
df_loop_item_dispose (GObject *object)
{
  DfLoopItem *self = DF_LOOP_ITEM (object);

  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  G_OBJECT_CLASS (df_loop_item_parent_class)->dispose (object);
}

static void
df_loop_item_finalize (GObject *object)
{
  DfLoopItem *self = DF_LOOP_ITEM (object);

  g_free (self->name);
  g_free (self->colour);
  g_free (self->uv);
  g_clear_pointer (&self->result, df_work_loop_result_free);
  g_free (self->error);
  g_free (self->summary);
  g_free (self->off_surface);
  G_OBJECT_CLASS (df_loop_item_parent_class)->finalize (object);
}

static void
df_loop_item_get_property (GObject    *object,
                           guint       prop_id,
                           GValue     *value,
                           GParamSpec *pspec)
{
  DfLoopItem *self = DF_LOOP_ITEM (object);

  switch (prop_id)
    {
    case PROP_NAME:
      g_value_set_string (value, self->name);
      break;
    case PROP_COLOUR:
      g_value_set_string (value, self->colour);
      break;
    case PROP_SHOW_FRAMES:
      g_value_set_boolean (value, self->show_frames);
      break;
    case PROP_STATE:
      g_value_set_int (value, self->state);
      break;
    case PROP_SUMMARY:
      g_value_set_string (value, df_loop_item_get_summary (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_loop_item_set_property (GObject      *object,
                           guint         prop_id,
                           const GValue *value,
                           GParamSpec   *pspec)
{
  DfLoopItem *self = DF_LOOP_ITEM (object);

  switch (prop_id)
    {
    case PROP_NAME:
      df_loop_item_set_name (self, g_value_get_string (value));
      break;
    case PROP_SHOW_FRAMES:
      df_loop_item_set_show_frames (self, g_value_get_boolean (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_loop_item_class_init (DfLoopItemClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_loop_item_dispose;
  object_class->finalize = df_loop_item_finalize;
  object_class->get_property = df_loop_item_get_property;
  object_class->set_property = df_loop_item_set_property;

  properties[PROP_NAME] =
    g_param_spec_string ("name", NULL, NULL, NULL,
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_COLOUR] =
    g_param_spec_string ("colour", NULL, NULL, NULL,
                         G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_SHOW_FRAMES] =
    g_param_spec_boolean ("show-frames", NULL, NULL, FALSE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_STATE] =
    g_param_spec_int ("state", NULL, NULL, DF_LOOP_PENDING, DF_LOOP_FAILED, DF_LOOP_PENDING,
                      G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_SUMMARY] =
    g_param_spec_string ("summary", NULL, NULL, NULL,
                         G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);
}

static void
df_loop_item_init (DfLoopItem *self)
{
  self->id = next_id++;
  self->state = DF_LOOP_PENDING;
}

DfLoopItem *
df_loop_item_new (const char    *name,
                  const char    *colour,
                  gboolean       show_frames,
                  const double (*uv)[2],
                  gsize          n)
{
  DfLoopItem *self = g_object_new (DF_TYPE_LOOP_ITEM, NULL);

  self->name = g_strdup (name != NULL ? name : "Loop");
  self->colour = g_strdup (colour != NULL ? colour : "#7b3fc4");
  self->show_frames = show_frames;
  self->uv = g_memdup2 (uv, n * sizeof *uv);
  self->n = n;
  return self;
}

guint
df_loop_item_get_id (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), 0);
  return self->id;
}

const char *
df_loop_item_get_name (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return self->name;
}

void
df_loop_item_set_name (DfLoopItem *self,
                       const char *name)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  if (name == NULL || g_strcmp0 (self->name, name) == 0)
    return;
  g_free (self->name);
  self->name = g_strdup (name);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_NAME]);
}

const char *
df_loop_item_get_colour (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return self->colour;
}

void
df_loop_item_get_rgba (DfLoopItem *self,
                       GdkRGBA    *rgba)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  if (!gdk_rgba_parse (rgba, self->colour))
    gdk_rgba_parse (rgba, "#7b3fc4");
}

gboolean
df_loop_item_get_show_frames (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), FALSE);
  return self->show_frames;
}

void
df_loop_item_set_show_frames (DfLoopItem *self,
                              gboolean    show)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  show = !!show;
  if (self->show_frames == show)
    return;
  self->show_frames = show;
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_FRAMES]);
}

const double (*df_loop_item_get_points (DfLoopItem *self,
                                        gsize      *n))[2]
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  *n = self->n;
  return (const double (*)[2]) self->uv;
}

DfLoopState
df_loop_item_get_state (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), DF_LOOP_FAILED);
  return self->state;
}

const df_loop_result *
df_loop_item_get_result (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return self->state == DF_LOOP_MEASURED ? self->result : NULL;
}

const char *
df_loop_item_get_error (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return self->state == DF_LOOP_FAILED ? self->error : NULL;
}

const char *
df_loop_item_get_summary (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);

  if (self->summary == NULL)
    {
      switch (self->state)
        {
        case DF_LOOP_PENDING:
          self->summary = g_strdup ("measuring…");
          break;
        case DF_LOOP_MEASURED:
          {
            g_autofree char *n = df_format_number (self->result->holonomy_rad * 180.0 / G_PI);
            self->summary = g_strdup_printf ("holonomy %s°", n);
          }
          break;
        case DF_LOOP_FAILED:
        default:
          self->summary = g_strdup ("not measured (see details)");
          break;
        }
    }
  return self->summary;
}

static void
set_state (DfLoopItem  *self,
           DfLoopState  state)
{
  g_clear_pointer (&self->summary, g_free);
  self->state = state;
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_STATE]);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SUMMARY]);
}

void
df_loop_item_set_pending (DfLoopItem *self)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  g_clear_pointer (&self->result, df_work_loop_result_free);
  g_clear_pointer (&self->error, g_free);
  set_state (self, DF_LOOP_PENDING);
}

void
df_loop_item_set_result (DfLoopItem     *self,
                         df_loop_result *result)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));
  g_return_if_fail (result != NULL);

  g_clear_pointer (&self->result, df_work_loop_result_free);
  g_clear_pointer (&self->error, g_free);
  self->result = result;
  set_state (self, DF_LOOP_MEASURED);
}

void
df_loop_item_set_failed (DfLoopItem *self,
                         const char *message)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  g_clear_pointer (&self->result, df_work_loop_result_free);
  g_free (self->error);
  self->error = g_strdup (message != NULL ? message : "unknown failure");
  set_state (self, DF_LOOP_FAILED);
}

void
df_loop_item_set_points (DfLoopItem    *self,
                         const double (*uv)[2],
                         gsize          n)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  g_free (self->uv);
  self->uv = g_memdup2 (uv, n * sizeof *uv);
  self->n = n;
  /* New chart points (the loop carried onto another surface): a drape start in the old chart
   * would name another place; the warp and the cell still mean what they did. */
  self->drape.has_start = FALSE;
}

const df_shear_setup *
df_loop_item_get_drape (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return &self->drape;
}

void
df_loop_item_set_drape (DfLoopItem           *self,
                        const df_shear_setup *drape)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));
  g_return_if_fail (drape != NULL);
  self->drape = *drape;
}

void
df_loop_item_set_colour (DfLoopItem *self,
                         const char *colour)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  if (colour == NULL || g_strcmp0 (self->colour, colour) == 0)
    return;
  g_free (self->colour);
  self->colour = g_strdup (colour);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_COLOUR]);
}

void
df_loop_item_set_off_surface (DfLoopItem *self,
                              const char *why)
{
  g_return_if_fail (DF_IS_LOOP_ITEM (self));

  g_free (self->off_surface);
  self->off_surface = g_strdup (why);
  if (why != NULL)
    {
      g_autofree char *message = NULL;

      /* A measurement on the way is of the loop's points, not of the loop. */
      if (self->cancellable != NULL)
        g_cancellable_cancel (self->cancellable);
      message = g_strdup_printf ("off the new surface: %s", why);
      df_loop_item_set_failed (self, message);
    }
}

const char *
df_loop_item_get_off_surface (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);
  return self->off_surface;
}

GCancellable *
df_loop_item_restart_cancellable (DfLoopItem *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ITEM (self), NULL);

  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  self->cancellable = g_cancellable_new ();
  return self->cancellable;
}
