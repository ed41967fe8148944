package main

const compareHelp = `gainscape compare — controller structures side by side

One plant (or a few), several panels: each panel is a controller structure
in the plane of two of its parameters, the others fixed, drawn as "gainscape
map" draws it. One figure holds every panel with one legend and one colour
scale, and one table gives per panel the figures to compare:

  best load design   the largest integral gain ki with Ms ≤ the bound: its
                     values, Ms, gain and phase margins, IE = 1/ki (the
                     integrated error after a unit load step at the plant
                     input), and from its step responses the IAE of the
                     load step and the overshoot and 2% settling time of a
                     setpoint step. The criterion is that of K. J. Åström,
                     H. Panagopoulos and T. Hägglund, Automatica 34(5), 1998.
  best decay         the largest decay rate with Ms ≤ the bound: its point,
                     decay rate σ, smallest damping ζ and Ms
  min Ms             the smallest Ms over the stable nodes of the window
  Ku, Tu             ultimate gain and period of the proportional-only loop
  stable             the share of the window that is stable

For a structure with a derivative gain kd that is not an axis (a PID in the
kp–ki plane), one more row gives the best load design over kd: the best ki
is found at 9 values of kd across --kd-range (default 0 to twice the kd
scale, Ku over the plant's frequency) and refined by golden-section search
between the neighbours of the best, each on a window chosen for that kd.

Windows: an axis given as NAME alone (--x kp), or not given, has its range
chosen: the window starts at twice the parameter's scale (Ku for kp,
Ku·ω for ki, Ku/ω for kd, ω for corner frequencies), grows on every side the
stable region reaches, and is then shrunk to the stable region with a small
margin; where the region is unbounded it is cut at 3 times the scale beyond
the region's other end. Panels of one structure in the same plane (the
slices, or the plants) share one window, the smallest holding each one's;
other structures keep their own. The window and the rule are printed.

Panels:
  --plant EXPR        the plant; repeatable, LABEL=EXPR, for a panel row per
                      plant (a nominal and a worn plant under the same
                      controllers)
                        --plant "nominal=1/(s+1)^4" --plant "worn=0.6/(s+1)^4"
  --num LIST --den LIST
                      the plant as coefficients, highest power first
  --ctrl LIST         the structures, one panel each (default pi,pid)
                        --ctrl pi,pid,lead
  --set LIST          fixed values for every structure that has those
                      parameters; STRUCT:LIST for one structure; repeatable
                        --set pid:kd=0.5,tau=0.05 --set lead:p=10
  --slices NAME=LIST  one panel per value of a parameter, for each structure
                      that has it; sample=LIST gives one panel per sample
                      time of a digital controller (0: continuous)
                        --slices kd=0,0.5,1,2   --slices sample=0,0.1,0.5
  --x [STRUCT:]NAME[=MIN:MAX], --y [STRUCT:]NAME[=MIN:MAX]
                      the axes (default: each structure's first two
                      parameters, ranges chosen); a plain axis applies to
                      every structure that has the parameter
                        --x kp --y ki=0:2   --x lead:k=0:20
  --sample T, --integral RULE, --time-unit UNIT
                      as for "gainscape map", for every panel
  --grid NXxNY        nodes of each panel (default 240x180)
Searches and overlays:
  --ms-bound X        the Ms limit of every search (default 1.4)
  --kd-range MIN:MAX  the range of the search over kd
                        --kd-range 0:3
  --ms-levels LIST    Ms iso-lines (default 1.4,2), or none
  --decay             shade every stable region by decay rate, on one scale
Output:
  -o, --out FILE      the figure of the panels, .png, .svg or .pdf
                      (default gainscape-compare.png); "" for none
  --responses FILE    the step responses of every panel's best load design
                      on shared axes (setpoint step above, load step below)
  --data FILE         JSON: a panels list, each with the fields of map --data
                      (controller, fixed, x, y, rhp, axis, boundaries, …), its
                      window, its table (best_ki, best_decay, min_ms,
                      ultimate, stable_share, best_ki_over_kd) and responses
                      (iae_load, overshoot, settling_time, …)
  --note FILE         a Markdown block with the figure, the tables (the bound
                      in their headers), the criterion's source and the
                      caution
  --title TEXT        replaces the title naming the plant
  --columns N         panels per row (default: 2 for 2 or 4 panels, else 3)
  --size WxH          image size in cm (default 17 cm wide, the width of a
                      printed page, and as tall as the panels need)
  --dpi N, --format png|svg|pdf, --quiet, --workers N
                      as for "gainscape map"
  --scenario FILE     read the comparison from a compare scenario file, one
                      [[panels]] section per panel (see
                      regions/scenario/SCHEMA.md); output, grid and search
                      flags beside it override the file, panel flags are
                      refused

Examples:
  gainscape compare --plant "1/(s+1)^4" --ctrl pi,pid,lead -o cmp.png --note cmp.md
  gainscape compare --plant "1/(s+1)^4" --ctrl pid --slices kd=0,0.5,1,2 --x kp --y ki
  gainscape compare --plant "nominal=1/(s+1)^4" --plant "worn=0.6/((s+1)^4*(0.5*s+1))" \
      --ctrl pi --data cmp.json --responses steps.png
  gainscape compare --plant "2/((4*s+1)*(s+1))" --ctrl pi --slices sample=0,0.2,0.5
  gainscape compare --scenario examples/conveyor-compare.toml

` + caution + "\n"
