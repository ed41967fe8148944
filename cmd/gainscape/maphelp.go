package main

const mapHelp = `gainscape map — the stable region of a loop in the plane of two controller parameters

The loop is unity negative feedback around plant G(s) with controller C(s).
Every grid node gets the number of closed-loop roots in the right half plane
and on the imaginary axis from the Routh sign-array test: stable (none in
either), marginal (some on the axis, none to its right; drawn violet, never
counted as stable) or unstable. Edges between regions are refined by
bisection and labelled with the frequency at which the loop oscillates there.

Plant (one of):
  --plant EXPR        rational expression in s: numbers, + - * / ^ ( )
                        --plant "2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))"
  --num LIST --den LIST
                      coefficients, highest power first
                        --num "1" --den "1, 3, 3, 1"
Controller:
  --ctrl NAME         p, pi, pd, pid, lead, lag, leadlag (default pid)
                        --ctrl pi
                      p:  kp                 pi: kp, ki        pd: kp, kd
                      pid: kp, ki, kd, tau (C = kp + ki/s + kd·s/(tau·s+1))
                      lead, lag: k, z, p (C = k(s+z)/(s+p))
                      leadlag: k, z1, p1, z2, p2
  --set LIST          values of the parameters that are not axes; repeatable,
                      and a parameter set twice must have one value
                        --set kd=0.5,tau=0.02  or  --set kd=0.5 --set tau=0.02
  --time-unit UNIT    the unit of time of s: s, ms, us, min or h (default s);
                      labels frequencies, decay rates and periods
                        --time-unit ms
Digital controller (a sampled-data loop):
  --sample T          sample time: the plant in s is held (zero-order hold,
                      exactly; a dead time is z^(−d) for whole samples, the
                      modified z-transform for a fraction) and sampled; a
                      plant written in z (--plant "0.2/(z-0.8)") needs it.
                      Roots are counted outside the unit circle; an edge is a
                      real root through z = 1 (ω = 0), through z = −1 (the
                      output alternates every sample, ω = π/T) or a pair
                      through e^(±jωT); decay rate −ln|z|/T; Ms up to π/T
                        --sample 0.1
  --integral RULE     the digital integral: backward ki·T·z/(z−1) (default),
                      forward ki·T/(z−1), trapezoid ki·(T/2)(z+1)/(z−1); the
                      derivative is kd·(z−1)/((tau+T)z − tau), lead and lag
                      use s = (2/T)(z−1)/(z+1)
                        --integral trapezoid
  --prewarp W         lead, lag, leadlag: pre-warp at the fixed frequency W
                      (rad per time unit, below π/T), s = (W/tan(WT/2))(z−1)/(z+1),
                      so that C matches the continuous one at W
                        --prewarp 3
  --compare-samples LIST
                      draw over the map the edges of the same window at
                      these sample times (and of the continuous loop), each
                      in its own style, and print the gain limit along x of
                      each (at the lowest y, or just above it when that row
                      is marginal); the plant must be given in s
                        --compare-samples 0.05,0.2,0.5
Dead time (a plant with one factor exp(-L*s)):
  --pade N            the counts come from the quasi-polynomial itself; the
                      window is also mapped with the delay replaced by its
                      order-N Padé approximant (sign array), and the summary
                      says where the two maps disagree; 0 (the default)
                      chooses N from the largest ωL of the window
                        --plant "2*exp(-1.5*s)/((4*s+1)*(s+1))" --pade 3
Window:
  --x NAME=MIN:MAX    horizontal axis (default: the controller's first
                      parameter, 0:10); NAME alone has its range chosen to
                      hold the whole stable region (the rule is printed;
                      see "gainscape help compare")
                        --x kp=0:20  or  --x kp
  --y NAME=MIN:MAX    vertical axis (default: its second parameter, 0:5);
                      NAME alone as for --x
                        --y ki=0:8  or  --y ki
  --grid NXxNY        nodes per axis, 2…4000 each (default 300x225)
                        --grid 400x300
  --workers N         goroutines (default: all cores); the map does not
                      depend on it
                        --workers 1
Output:
  -o, --out FILE      image, .png, .svg or .pdf (default gainscape-map.png);
                      - writes it to standard output (as may any one output)
                        -o pump-pid.svg
  --format png|svg|pdf
                      image format when the file name does not say; it must
                      agree with the extension when it does
                        -o - --format svg > map.svg
  --dpi N             resolution of a PNG image, 50…1200 (default 200),
                      written into the file so documents size it right
                        --dpi 300
  --data FILE         the map as JSON: axes, counts, boundaries with ω
                        --data region.json
  --csv FILE          the boundary polylines: curve, kind, x, y, ω
                        --csv edges.csv
  --note FILE         a Markdown block for a design note: image link, loop,
                      stable ranges and the caution
                        --note design-note.md
  --title TEXT        replaces the plant-and-controller title
                        --title "Pressure loop, PID with kd = 0.5"
  --size WxH          image size in centimetres (default 16x12)
                        --size 18x13
  --quiet             print nothing but errors (and no progress bar)
                        --quiet
Overlays (inside the stable region):
  --decay             shade by decay rate σ, the distance of the slowest
                      closed-loop root from the imaginary axis
                        --decay
  --decay-levels LIST iso-lines of decay rate
                        --decay-levels 0.2,0.4
  --damping-levels LIST
                      iso-lines of the smallest damping ratio ζ
                        --damping-levels 0.5,0.7
  --ms-levels LIST    iso-lines of Ms, the peak sensitivity (default 1.4,2;
                      the usual robustness band, common practice); none
                      turns them off
                        --ms-levels 1.6  or  --ms-levels none
  --mark LIST         mark a design point, labelled with its σ and Ms;
                      repeatable
                        --mark kp=2,ki=0.8 --mark kp=4,ki=1.5
  --best LIST         search for best points: decay (largest decay rate) and
                      ki (largest integral gain with Ms ≤ --ms-bound); a
                      search that finds nothing says why and the map is drawn
                        --best decay,ki
  --ms-bound X        the Ms limit of the searches; without it the ki search
                      uses 1.4 and the decay search none (the summary says
                      which bound was used)
                        --ms-bound 1.6
Scenario files:
  --scenario FILE     read the map from a scenario file (TOML); flags given
                      on the command line override it
                        --scenario examples/heated-tank.toml
  --save-scenario FILE
                      write the scenario of this map, to re-make it exactly
                        --save-scenario figure-3.toml
  --allow-outside-paths
                      let a scenario file's output paths leave the file's own
                      folder (refused by default: a shared scenario must not
                      write elsewhere)
                        --allow-outside-paths

With no plant flag, a built-in demo scenario (an invented pump pressure loop)
is drawn into gainscape-demo.png in the current directory.

Every output is checked before any work and written only when all are
ready; an error or an interrupt (Ctrl-C, SIGTERM, SIGHUP) leaves every
existing file as it was. Errors exit with 2, interrupts with 128 + the
signal number.

Examples:
  gainscape map
  gainscape map --plant "1/(s+1)^3" --ctrl pi --x kp=0:8 --y ki=0:3 -o pi.png
  gainscape map --num "4" --den "0.5, 2.5, 3, 1" --ctrl pid --set kd=0.3,tau=0.05 \
      --x kp=0:15 --y ki=0:10 --grid 400x300 -o pid.svg --data pid.json
  gainscape map --plant "1/(s+1)^3" --ctrl pi --decay --best decay,ki --mark kp=1,ki=0.4
  gainscape map --scenario examples/heated-tank.toml -o tank.svg
  gainscape map --plant "1/(s*(s+1))" --ctrl pi --sample 1 --x kp=0:3 --y ki=0:1 \
      --compare-samples 0.1,0.5,2 -o sampling.png
`
