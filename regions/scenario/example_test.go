package scenario_test

import (
	"fmt"
	"strings"

	"gainscape/regions/scenario"
)

// The scenario is invented for this example: the temperature loop of a
// heated tank, a slow first-order lag with a faster heater lag and a
// thermocouple lag, under a filtered PID.
func ExampleDecode() {
	const file = `
schema = 1

[loop]
plant = "0.8/((12*s+1)*(s+1)*(0.5*s+1))"  # °C per % heater power, invented
controller = "pid"

[axes]
x = "kp=0:15"
y = "ki=0:2"
grid = "400x300"

[fixed]
kd = 4
tau = 0.2

[overlays]
ms_levels = [1.4, 2.0]
marks = [{kp = 3, ki = 0.25}]

[output]
image = "tank-pid.svg"
data = "tank-pid.json"
`
	s, err := scenario.Decode(strings.NewReader(file), "tank.toml")
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := s.Validate(); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("plant:", s.Loop.Plant, "under", s.Loop.Controller)
	fmt.Printf("window: %s from %g to %g, %s from %g to %g, %dx%d nodes\n",
		s.Axes.X.Param, s.Axes.X.Min, s.Axes.X.Max, s.Axes.Y.Param, s.Axes.Y.Min, s.Axes.Y.Max, s.Axes.Columns, s.Axes.Rows)
	fmt.Println("fixed:", s.Fixed)
	fmt.Println("Ms levels:", s.Overlays.MsLevels, "marks:", s.Overlays.Marks)
	fmt.Println("image:", s.Output.Image, "size:", s.Output.WidthCm, "x", s.Output.HeightCm, "cm (default)")

	_, err = scenario.Decode(strings.NewReader("schema = 1\n[axes]\ngrid = 400\n"), "typo.toml")
	fmt.Println(err)
	// Output:
	// plant: 0.8/((12*s+1)*(s+1)*(0.5*s+1)) under pid
	// window: kp from 0 to 15, ki from 0 to 2, 400x300 nodes
	// fixed: [{kd 4} {tau 0.2}]
	// Ms levels: [1.4 2] marks: [[{kp 3} {ki 0.25}]]
	// image: tank-pid.svg size: 16 x 12 cm (default)
	// scenario file "typo.toml", line 3: axes.grid: expected a string such as "400x300", found the integer 400
}

// ExampleScenario_Override shows how the command applies its flags over a
// scenario file: only the flags given explicitly replace file values.
func ExampleScenario_Override() {
	s, _ := scenario.Decode(strings.NewReader("schema = 1\n[loop]\nplant = \"1/(s+1)^3\"\n[axes]\ngrid = \"400x300\"\n"), "lag.toml")

	var flags scenario.Scenario // filled from the command line
	flags.Axes.Columns, flags.Axes.Rows = 100, 80
	flags.Output.Image = "quick.png"
	given := map[string]bool{"grid": true, "out": true}

	s.Override(flags, func(name string) bool { return given[name] })
	fmt.Println(s.Loop.Plant, s.Axes.Columns, s.Axes.Rows, s.Output.Image)
	// Output:
	// 1/(s+1)^3 100 80 quick.png
}

// ExampleScenario_Validate shows where problems are reported: against the
// file, line and key for a value the file gave, against the flag for a
// value a flag replaced. The file is invented for this example.
func ExampleScenario_Validate() {
	const file = `schema = 1
[loop]
plant = "1/(s+1)^3"
[fixed]
ki = 0.5
[overlays]
best = ["fastest"]
`
	s, _ := scenario.Decode(strings.NewReader(file), "lag.toml")
	fmt.Println(s.Validate())

	var flags scenario.Scenario
	flags.Overlays.Best = []string{"ki", "ki"}
	s.Override(flags, func(name string) bool { return name == "best" })
	fmt.Println(s.Validate())
	// Output:
	// scenario file "lag.toml", line 5: fixed.ki: ki is swept by axes.y; an axis parameter cannot also be fixed
	// scenario file "lag.toml", line 7: overlays.best[1]: "fastest" is not a search; the searches are decay and ki
	// scenario file "lag.toml", line 5: fixed.ki: ki is swept by axes.y; an axis parameter cannot also be fixed
	// --best: "ki" is listed twice
}

// ExampleScenario_ResolvePaths runs a scenario kept in another folder:
// its output paths are taken from that folder, and one that would leave
// it is refused. The file is invented for this example.
func ExampleScenario_ResolvePaths() {
	s, _ := scenario.Decode(strings.NewReader("schema = 1\n[output]\nimage = \"pump.svg\"\n"), "designs/pump.toml")
	fmt.Println(s.ResolvePaths(false), s.Output.Image)

	s, _ = scenario.Decode(strings.NewReader("schema = 1\n[output]\ndata = \"../../.profile.json\"\n"), "designs/pump.toml")
	fmt.Println(s.ResolvePaths(false))
	// Output:
	// <nil> designs/pump.svg
	// scenario file "designs/pump.toml", line 3: output.data: "../../.profile.json" climbs out of the scenario's folder; a scenario writes only inside its own folder unless --allow-outside-paths is given
}
