/* test-bad-inputs.c: the catalogue of malformed inputs. Each case writes one file (a surface,
 * a project or a loop) into a fresh folder, runs driftframe-cli on it with the given options
 * and checks the exit status (2: bad input, README "Exit status") and parts of the message:
 * it names the file and the line, group or key, or the option; it says what is wrong; and it
 * never shows a non-finite number ("inf", "nan"). The expected texts are this project's own
 * wording (common practice, no source); the line numbers are counted by hand from each
 * case's text. Cases with status 0 are inputs that must be accepted (a byte-order mark). */
#include <glib.h>
#include <glib/gstdio.h>
#include <string.h>

#include "fuzz/fuzz-common.h"

typedef struct
{
  const char *id;
  const char *file;         /* name of the file to write, or NULL */
  const char *content;      /* its bytes (may hold a NUL), or a generator's name */
  gsize       length;
  const char *args;         /* driftframe-cli arguments, split like a shell would */
  int         status;       /* expected exit status */
  const char *must[4];      /* parts of stderr (status != 0) or stdout (0), NULL-ended */
} bad_input;

static const bad_input cases[] = {
  { "surface-empty", "s.surface", "  \n", sizeof ("  \n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface: the file is empty", NULL } },
  { "surface-not-utf8", "s.surface", "[surface]\nkind=revol\xff\n", sizeof ("[surface]\nkind=revol\xff\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:2:", "not UTF-8", NULL } },
  { "surface-nul-byte", "s.surface", "[surface]\nkind=revol\0ution\n", sizeof ("[surface]\nkind=revol\0ution\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:2:", "NUL byte", NULL } },
  { "surface-bad-group-header", "s.surface", "[surface\nkind=graph\n", sizeof ("[surface\nkind=graph\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:1:", "group header", NULL } },
  { "surface-line-without-equals", "s.surface", "[surface]\nkind=graph\nz x*y\n", sizeof ("[surface]\nkind=graph\nz x*y\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:3:", "expected key=value", NULL } },
  { "surface-key-before-group", "s.surface", "kind=graph\n[surface]\n", sizeof ("kind=graph\n[surface]\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:1:", "before the first [group]", NULL } },
  { "surface-repeated-group", "s.surface", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[surface]\nunits=mm\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[surface]\nunits=mm\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:9:", "group [surface] appears again", "first at line 1", NULL } },
  { "surface-repeated-key", "s.surface", "[surface]\nkind=revolution\nr=1\nr=2\n", sizeof ("[surface]\nkind=revolution\nr=1\nr=2\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:4:", "key 'r' is given again", "first at line 3", NULL } },
  { "surface-repeated-parameter", "s.surface", "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\na=1\na=2\n", sizeof ("[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\na=1\na=2\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:10:", "key 'a' is given again", "line 9", NULL } },
  { "surface-bad-escape-then-backslash", "s.surface", "[surface]\nkind=\\q\\\n", sizeof ("[surface]\nkind=\\q\\\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:2:", "kind", "unknown escape", NULL } },
  { "surface-trailing-backslash", "s.surface", "[surface]\nkind=graph\\\n", sizeof ("[surface]\nkind=graph\\\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface:2:", "kind", "lone", NULL } },
  { "surface-escaped-newline-in-units", "s.surface", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\nunits=mm\\nsecond\n[parameters]\nR=100\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\nunits=mm\\nsecond\n[parameters]\nR=100\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "units", "line break", NULL } },
  { "surface-missing-group", "s.surface", "[parameters]\nR=1\n", sizeof ("[parameters]\nR=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "missing group [surface]", NULL } },
  { "surface-unknown-key", "s.surface", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nradius=5\nt-min=0\nt-max=pi\n[parameters]\nR=100\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nradius=5\nt-min=0\nt-max=pi\n[parameters]\nR=100\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "unknown key 'radius'", NULL } },
  { "surface-unknown-kind", "s.surface", "[surface]\nkind=revol\n", sizeof ("[surface]\nkind=revol\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "kind", "unknown kind 'revol'", NULL } },
  { "surface-missing-r", "s.surface", "[surface]\nkind=revolution\nz=t\nt-min=0\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nz=t\nt-min=0\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "missing key 'r'", NULL } },
  { "surface-graph-with-r", "s.surface", "[surface]\nkind=graph\nz=x*y\nr=1\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n", sizeof ("[surface]\nkind=graph\nz=x*y\nr=1\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "a graph has no r", NULL } },
  { "surface-graph-with-t-min", "s.surface", "[surface]\nkind=graph\nz=x*y\nt-min=0\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n", sizeof ("[surface]\nkind=graph\nz=x*y\nt-min=0\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "t-min", "not a key of a graph", NULL } },
  { "surface-formula-syntax", "s.surface", "[surface]\nkind=revolution\nr=2 * * t\nz=-t\nt-min=0\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nr=2 * * t\nz=-t\nt-min=0\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "r: column 5", "operand", NULL } },
  { "surface-unknown-function", "s.surface", "[surface]\nkind=revolution\nr=sinn(t) + 2\nz=-t\nt-min=0\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nr=sinn(t) + 2\nz=-t\nt-min=0\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "r: column 1", "unknown function 'sinn'", NULL } },
  { "surface-reversed-range", "s.surface", "[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=2\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=2\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "t-max", "greater than t-min", NULL } },
  { "surface-number-too-large", "s.surface", "[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=0\nt-max=1e309\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=0\nt-max=1e309\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "t-max", "too large", NULL } },
  { "surface-t-max-1e308", "s.surface", "[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=0\nt-max=1e308\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=0\nt-max=1e308\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "extent overflows", NULL } },
  { "surface-range-too-wide", "s.surface", "[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=-1e308\nt-max=1e308\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=-1e308\nt-max=1e308\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "t-min to t-max", "too wide", NULL } },
  { "surface-range-without-digits", "s.surface", "[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=1e10\nt-max=1e10 + 1e-3\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0*t\nz=-t\nt-min=1e10\nt-max=1e10 + 1e-3\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "t-min to t-max", "too narrow for its numbers", NULL } },
  { "surface-thin-profile-range", "s.surface", "[surface]\nkind=revolution\nr=1 + 0.5*cos(t)\nz=0.5*sin(t)\nt-min=0\nt-max=1e-8\n", sizeof ("[surface]\nkind=revolution\nr=1 + 0.5*cos(t)\nz=0.5*sin(t)\nt-min=0\nt-max=1e-8\n") - 1,
    "probe --surface s.surface --at 0,0", 2, { "s.surface", "along the profile (t)", "a strip that thin", NULL } },
  { "surface-graph-overflows", "s.surface", "[surface]\nkind=graph\nz=1e200*x\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n", sizeof ("[surface]\nkind=graph\nz=1e200*x\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "extent overflows", NULL } },
  { "surface-negative-radius", "s.surface", "[surface]\nkind=revolution\nr=0.4 - t\nz=t\nt-min=0\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nr=0.4 - t\nz=t\nt-min=0\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "r = ", "< 0 at t = 0.4", NULL } },
  { "surface-zero-speed", "s.surface", "[surface]\nkind=revolution\nr=1\nz=2\nt-min=0\nt-max=1\n", sizeof ("[surface]\nkind=revolution\nr=1\nz=2\nt-min=0\nt-max=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "zero speed", NULL } },
  { "surface-unknown-group", "s.surface", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[params]\nR=1\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[params]\nR=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "unknown group [params]", NULL } },
  { "surface-bad-parameter-name", "s.surface", "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\n2a=1\n", sizeof ("[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\n2a=1\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "[parameters] 2a", "not a valid parameter name", NULL } },
  { "surface-parameter-overflows", "s.surface", "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\na=1e200^2\n", sizeof ("[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n[parameters]\na=1e200^2\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "[parameters] a", "not finite", NULL } },
  { "surface-formula-too-long", "s.surface", "LONGFORMULA", sizeof ("LONGFORMULA") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "z: column 1", "more than the 10000 allowed", NULL } },
  { "surface-too-many-parameters", "s.surface", "MANYPARAMS", sizeof ("MANYPARAMS") - 1,
    "probe --surface s.surface --at 0.1,0.1", 2, { "s.surface", "p1000", "more than 1000 parameters", NULL } },
  { "surface-bom-accepted", "s.surface", "\xef\xbb\xbf[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n", sizeof ("\xef\xbb\xbf[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n") - 1,
    "probe --surface s.surface --at 0.1,0.1", 0, { "Gaussian", NULL } },
  { "project-patch-size", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[limits]\npatch-size=-2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[limits]\npatch-size=-2\n") - 1,
    "check --project p.dfproj", 2, { "p.dfproj", "[limits] patch-size", "is not a positive length", NULL } },
  { "project-empty-u", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=\nv=\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=\nv=\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] u", "no values", NULL } },
  { "project-count-mismatch", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] u", "3 values but v has 2", NULL } },
  { "project-two-points", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1\nv=0;1\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1\nv=0;1\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] u", "at least 3", NULL } },
  { "project-not-a-number", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;x;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;x;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] u", "value 2 'x' is not a number", NULL } },
  { "project-point-outside", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=5;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=5;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] point 1", "outside the surface", NULL } },
  { "project-bad-colour", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\ncolour=#12345\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\ncolour=#12345\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] colour", "not a colour", NULL } },
  { "project-bad-frames", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nframes=maybe\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nframes=maybe\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] frames", "neither true nor false", NULL } },
  { "project-repeated-loop-group", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj:12:", "group [loop 1] appears again", "first at line 9", NULL } },
  { "project-repeated-loop-key", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\nu=1;2;3\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\nu=1;2;3\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj:12:", "[loop 1] key 'u' is given again", "line 10", NULL } },
  { "project-unknown-loop-key", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nw=1\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nw=1\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] unknown key 'w'", NULL } },
  { "project-nul-byte", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nname=a\0b\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nname=a\0b\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj:10:", "NUL byte", NULL } },
  { "project-newline-in-name", "p.dfproj", "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nname=a\\nb\nu=1;1;1.5\nv=0;1;2\n", sizeof ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nname=a\\nb\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 2, { "p.dfproj", "[loop 1] name", "line break", NULL } },
  { "project-bom-accepted", "p.dfproj", "\xef\xbb\xbf[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n", sizeof ("\xef\xbb\xbf[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=100\n[loop 1]\nu=1;1;1.5\nv=0;1;2\n") - 1,
    "report --project p.dfproj", 0, { "loop 1", NULL } },
  { "loop-header-two-unknown-fields", "l.csv", "a,b\n1,2\n", sizeof ("a,b\n1,2\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:1:", "unknown header 'a,b'", NULL } },
  { "loop-missing-header", "l.csv", "0.5,0\n0.5,1\n", sizeof ("0.5,0\n0.5,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:1:", "missing header", NULL } },
  { "loop-identical-rows", "l.csv", "u,v\n0.5,1\n0.5,1\n0.5,1\n", sizeof ("u,v\n0.5,1\n0.5,1\n0.5,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv", "only 1 different point", "rows repeat", NULL } },
  { "loop-wrong-field-count", "l.csv", "u,v\n0.5,0\n0.5,1,2\n", sizeof ("u,v\n0.5,0\n0.5,1,2\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:3:", "expected 2 numbers, found 3", NULL } },
  { "loop-empty-field", "l.csv", "u,v\n0.5,\n", sizeof ("u,v\n0.5,\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "field 2 is empty", NULL } },
  { "loop-not-a-number", "l.csv", "u,v\nabc,1\n", sizeof ("u,v\nabc,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "field 1", "'abc' is not a number", NULL } },
  { "loop-number-overflows", "l.csv", "u,v\n1e999,1\n", sizeof ("u,v\n1e999,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "field 1", "not a finite number", NULL } },
  { "loop-unbalanced-quote", "l.csv", "u,v\n\"0.5,1\n", sizeof ("u,v\n\"0.5,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "unbalanced quote", NULL } },
  { "loop-point-outside", "l.csv", "u,v\n5,0\n0.5,1\n0.5,2\n", sizeof ("u,v\n5,0\n0.5,1\n0.5,2\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "lies outside the surface", "t in [0, 3.14159]", NULL } },
  { "loop-space-point-far", "l.csv", "x,y,z\n1000,0,0\n0,100,0\n-100,0,0\n", sizeof ("x,y,z\n1000,0,0\n0,100,0\n-100,0,0\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv:2:", "from the surface", NULL } },
  { "loop-empty", "l.csv", "# nothing\n", sizeof ("# nothing\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv", "the file is empty", NULL } },
  { "loop-two-points", "l.csv", "u,v\n0.5,0\n0.5,1\n", sizeof ("u,v\n0.5,0\n0.5,1\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv", "2 points, need at least 3", NULL } },
  { "loop-nul-byte", "l.csv", "u,v\n0.5,0\0\n", sizeof ("u,v\n0.5,0\0\n") - 1,
    "measure --preset sphere --loop l.csv", 2, { "l.csv", "not a text file", NULL } },
  { "cli-unknown-preset", NULL, NULL, 0,
    "probe --preset nosuch --at 1,1", 2, { "unknown preset 'nosuch'", NULL } },
  { "cli-param-unknown-name", NULL, NULL, 0,
    "probe --preset sphere --param r=5 --at 1,1", 2, { "--param r=5", "unknown parameter 'r'", NULL } },
  { "cli-param-without-value", NULL, NULL, 0,
    "probe --preset sphere --param R --at 1,1", 2, { "--param R", "expected KEY=VALUE", NULL } },
  { "cli-param-empty-value", NULL, NULL, 0,
    "probe --preset sphere --param R= --at 1,1", 2, { "--param R=", "no value given", NULL } },
  { "cli-param-negative-radius", NULL, NULL, 0,
    "probe --preset sphere --param R=-5 --at 1,1", 2, { "--param R=-5", "R must be greater than 0", NULL } },
  { "cli-param-cone-90", NULL, NULL, 0,
    "probe --preset cone --param alpha_deg=90 --at 1,0", 2, { "alpha_deg", "greater than 0 and less than 90", NULL } },
  { "cli-param-torus-tube-too-wide", NULL, NULL, 0,
    "probe --preset torus --param a=150 --at 1,0", 2, { "--param a=150", "less than R", NULL } },
  { "cli-param-sphere-1e300", NULL, NULL, 0,
    "probe --preset sphere --param R=1e300 --at 1,0", 2, { "preset sphere", "extent overflows", NULL } },
  { "cli-param-cylinder-1e13", NULL, NULL, 0,
    "geodesic --preset cylinder --param R=1e13 --from 75,0 --heading 0 --length 10", 2, { "preset cylinder", "more than the 1e+12 allowed", NULL } },
  { "cli-param-overflows", NULL, NULL, 0,
    "probe --preset sphere --param R=1e200^2 --at 1,1", 2, { "--param", "R: column 6", "not finite", NULL } },
  { "cli-at-one-number", NULL, NULL, 0,
    "probe --preset sphere --at 1", 2, { "--at", "two numbers", NULL } },
  { "cli-at-outside", NULL, NULL, 0,
    "probe --preset sphere --at 5,0", 2, { "5", "outside", NULL } },
  { "cli-heading-1e308", NULL, NULL, 0,
    "geodesic --preset sphere --from 1,0 --heading 1e308 --length 10", 2, { "--heading", "outside [-360, 360]", NULL } },
  { "cli-length-negative", NULL, NULL, 0,
    "geodesic --preset sphere --from 1,0 --heading 0 --length -1", 2, { "--length", "must be positive", NULL } },
  { "cli-count-one", NULL, NULL, 0,
    "geodesic --preset sphere --from 1,0 --heading 0 --length 1 --count 1", 2, { "--count", "outside", NULL } },
  { "cli-tolerance-zero", NULL, NULL, 0,
    "measure --preset sphere --tolerance 0 --loop none.csv", 2, { "--tolerance", "outside", NULL } },
  { "cli-loop-required", NULL, NULL, 0,
    "measure --preset sphere", 2, { "--loop is required", NULL } },
  { "cli-missing-surface-file", NULL, NULL, 0,
    "probe --surface none.surface --at 1,1", 2, { "none.surface", "No such file", NULL } },
};

/* LONGFORMULA: a graph whose z formula is 10 001 characters; MANYPARAMS: 1001 parameters. */
static char *
generated (const char *name, gsize *length)
{
  GString *text = g_string_new (NULL);

  if (g_str_equal (name, "LONGFORMULA"))
    {
      g_string_append (text, "[surface]\nkind=graph\nz=x");
      for (int i = 0; i < 5000; i++)
        g_string_append (text, "+x");
      g_string_append (text, "\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1\n");
    }
  else if (g_str_equal (name, "MANYPARAMS"))
    {
      g_string_append (text, "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\n"
                             "y-max=1\n[parameters]\n");
      for (int i = 0; i <= 1000; i++)
        g_string_append_printf (text, "p%d=%d\n", i, i);
    }
  else
    {
      g_string_free (text, TRUE);
      return NULL;
    }
  *length = text->len;
  return g_string_free (text, FALSE);
}

static void
run_case (gconstpointer data)
{
  const bad_input *c = data;
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-bad-XXXXXX", &error);
  g_auto (GStrv) args = NULL;
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  g_autofree char *out = NULL;
  g_autofree char *err = NULL;
  const char *shown;
  int wait_status = 0;
  int argc = 0;

  g_assert_no_error (error);
  if (c->file != NULL)
    {
      g_autofree char *path = g_build_filename (dir, c->file, NULL);
      gsize length = c->length;
      g_autofree char *gen = generated (c->content, &length);

      g_file_set_contents (path, gen != NULL ? gen : c->content, (gssize) length, &error);
      g_assert_no_error (error);
    }
  g_shell_parse_argv (c->args, &argc, &args, &error);
  g_assert_no_error (error);
  g_ptr_array_add (argv, (char *) DF_CLI_PATH);
  for (int i = 0; i < argc; i++)
    g_ptr_array_add (argv, args[i]);
  g_ptr_array_add (argv, NULL);
  g_spawn_sync (dir, (char **) argv->pdata, NULL, G_SPAWN_DEFAULT, NULL, NULL, &out, &err,
                &wait_status, &error);
  g_assert_no_error (error);
  g_test_message ("%s: driftframe-cli %s\nstderr: %s", c->id, c->args, err);

  g_assert_true (WIFEXITED (wait_status));
  g_assert_cmpint (WEXITSTATUS (wait_status), ==, c->status);
  shown = c->status == 0 ? out : err;
  for (int i = 0; c->must[i] != NULL; i++)
    if (strstr (shown, c->must[i]) == NULL)
      g_error ("%s: expected '%s' in: %s", c->id, c->must[i], shown);
  g_assert_false (fuzz_text_shows_nonfinite (err));
  if (c->status != 0)
    {
      /* One line, and nothing from GLib before it. */
      g_assert_true (g_str_has_prefix (err, "driftframe-cli "));
      g_assert_nonnull (strchr (err, '\n'));
      g_assert_cmpint (strchr (err, '\n')[1], ==, '\0');
    }
  if (c->file != NULL)
    {
      g_autofree char *path = g_build_filename (dir, c->file, NULL);

      g_remove (path);
    }
  g_rmdir (dir);
}

int
main (int argc, char **argv)
{
  g_test_init (&argc, &argv, NULL);
  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autofree char *path = g_strdup_printf ("/bad-inputs/%s", cases[i].id);

      g_test_add_data_func (path, &cases[i], run_case);
    }
  return g_test_run ();
}
