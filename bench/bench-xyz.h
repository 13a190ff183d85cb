/* bench-xyz.h: the x,y,z part of bench-measure: space points placed on the surface, timed in
 * process, as a whole CLI process and against the SymPy + SciPy reference script. */
#pragma once

/* Prints the figures; tmp_dir receives the temporary files (removed again). */
void bench_xyz_run (int repeats, const char *tmp_dir);
