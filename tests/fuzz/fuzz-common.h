/* fuzz-common.h: what every fuzz target checks beyond "no crash": a failure always comes with
 * a message, and a message never shows a non-finite number. Shared with the bad-input
 * catalogue test (tests/test-bad-inputs.c). A broken rule calls abort(), which libFuzzer
 * reports as a crash and the replay driver as a failed case. */
#pragma once

#include <glib.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* TRUE when text shows "inf", "infinity" or "nan" as a word (case-insensitive) outside the
 * user's own text, which messages quote as '...' or name as [group]: a number that was
 * printed without being checked. */
static inline gboolean
fuzz_text_shows_nonfinite (const char *text)
{
  static const char *const words[] = { "infinity", "inf", "nan" };
  char quote = 0;

  for (const char *s = text; *s != '\0'; s++)
    {
      if (quote != 0)
        {
          if (*s == quote)
            quote = 0;
          continue;
        }
      if (*s == '\'' || *s == '[')
        {
          quote = *s == '[' ? ']' : '\'';
          continue;
        }
      if (s > text && g_ascii_isalnum (s[-1]))
        continue;
      for (gsize w = 0; w < G_N_ELEMENTS (words); w++)
        {
          gsize len = strlen (words[w]);

          if (g_ascii_strncasecmp (s, words[w], len) == 0 && !g_ascii_isalnum (s[len])
              && s[len] != '_')
            return TRUE;
        }
    }
  return FALSE;
}

/* Aborts unless a failed call left a non-empty message free of non-finite numbers. */
static inline void
fuzz_check_error (const char *what, const GError *error)
{
  if (error == NULL || error->message == NULL || error->message[0] == '\0')
    {
      fprintf (stderr, "%s failed without a message\n", what);
      abort ();
    }
  if (fuzz_text_shows_nonfinite (error->message))
    {
      fprintf (stderr, "%s: message shows a non-finite number: %s\n", what, error->message);
      abort ();
    }
}

/* Aborts when a core detail shows a non-finite number. */
static inline void
fuzz_check_detail (const char *what, const char *detail)
{
  if (fuzz_text_shows_nonfinite (detail))
    {
      fprintf (stderr, "%s: detail shows a non-finite number: %s\n", what, detail);
      abort ();
    }
}

#define FUZZ_REQUIRE(cond)                                                                    \
  do                                                                                          \
    {                                                                                         \
      if (!(cond))                                                                            \
        {                                                                                     \
          fprintf (stderr, "%s:%d: broken rule: %s\n", __FILE__, __LINE__, #cond);           \
          abort ();                                                                           \
        }                                                                                     \
    }                                                                                         \
  while (0)

/* The input as a NUL-terminated string (a NUL inside ends it early: the text readers see
 * C strings; the key file target passes the bytes with their length instead). */
static inline char *
fuzz_string (const unsigned char *data, size_t size)
{
  char *text = g_malloc (size + 1);

  memcpy (text, data, size);
  text[size] = '\0';
  return text;
}

int LLVMFuzzerTestOneInput (const unsigned char *data, size_t size);

/* Set by the replay driver (fuzz-replay.c), which defines it again without weak: replayed
 * inputs are read whatever their size, while the fuzzer skips inputs above each target's
 * FUZZ_MAX_INPUT to keep one run fast. */
#ifdef FUZZ_REPLAY_MAIN
extern int fuzz_replaying;
#else
__attribute__ ((weak)) int fuzz_replaying;
#endif
