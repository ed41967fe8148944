package expr_test

import (
	"fmt"

	"gainscape/regions/expr"
)

func ExampleParse() {
	// A plant with a zero, an integrator, a double pole and a small lag.
	num, den, err := expr.Parse("2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("num:", num)
	fmt.Println("den:", den)
	fmt.Println("degrees:", num.Degree(), den.Degree())
	// Output:
	// num: 2.5·s + 1
	// den: 0.2·s^4 + 1.6·s^3 + 3.45·s^2 + 2.25·s
	// degrees: 1 4
}

func ExampleParse_noCancellation() {
	// The zero at -2 and the pole at -2 are both kept.
	num, den, _ := expr.Parse("(s+2)/((s+2)*(s+5))")
	fmt.Println(num, "over", den)
	// Output:
	// s + 2 over s^2 + 7·s + 10
}

func ExampleParse_error() {
	_, _, err := expr.Parse("3/(s+1)(s+4)")
	fmt.Println(err)
	_, _, err = expr.Parse("2*(s+1")
	fmt.Println(err)
	// Output:
	// plant expression "3/(s+1)(s+4)": at column 8: expected "*" before "("; multiplication must be written out
	// plant expression "2*(s+1": at column 7: expected ")" but the expression ended; the "(" at column 3 is still open
}

func ExampleParseList() {
	p, err := expr.ParseList("1, 3.5, 0, 2")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p)
	fmt.Println("ascending, as stored:", []float64(p))

	_, err = expr.ParseList("1, 0.8 s, 2")
	fmt.Println(err)
	// Output:
	// s^3 + 3.5·s^2 + 2
	// ascending, as stored: [2 0 3.5 1]
	// coefficient list "1, 0.8 s, 2": at column 8: item 3 "s" is not a number; give the coefficients alone, highest power first, separated by commas or spaces
}

func ExampleCheck() {
	num, _ := expr.ParseList("1, 0, 0, 4")
	den, _ := expr.ParseList("2, 1, 7")
	fmt.Println(expr.Check(num, den))

	num, den, _ = expr.Parse("(s+1)/(s^2+s+7)")
	fmt.Println(expr.Check(num, den))
	// Output:
	// plant is not proper: numerator degree 3 exceeds denominator degree 2
	// <nil>
}

func ExampleParsePlant() {
	// An invented heating zone: gain 2, lags of 4 s and 1 s, dead time 1.5 s.
	pl, err := expr.ParsePlant("2*exp(-1.5*s)/((4*s+1)*(s+1))")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("num:", pl.Num)
	fmt.Println("den:", pl.Den)
	fmt.Println("delay:", pl.Delay)

	_, err = expr.ParsePlant("1/((s+1)*exp(-2*s))")
	fmt.Println(err)
	// Output:
	// num: 2
	// den: 4·s^2 + 5·s + 1
	// delay: 1.5
	// plant expression "1/((s+1)*exp(-2*s))": at column 10: a dead time in a divisor is a predictor e^(+L*s), which no plant has; write exp(-L*s) in the numerator
}

func ExampleParseIn() {
	// An invented sampled-data plant given directly in z, with one sample
	// of delay written as 1/z.
	pl, err := expr.ParseIn("0.1/(z*(z-0.9))", 'z')
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(pl.Num, "over", pl.Den.Descending())

	_, err = expr.ParseIn("0.1/(s+1)", 'z')
	fmt.Println(err)
	// Output:
	// 0.1 over [1 -0.9 0]
	// plant expression "0.1/(s+1)": at column 6: unknown name "s": the only variable is z; an expression in z describes a sampled-data plant and cannot contain s
}
