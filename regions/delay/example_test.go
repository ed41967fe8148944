package delay_test

import (
	"fmt"

	"gainscape/regions/delay"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// A loop with dead time as the seam takes it: plant N/D·e^(−Ls) under a
// controller Nc/Dc gives P = Dc·D and Q = Nc·N. Here an invented plant
// e^(−s)/(s + 1) under P control at three gains.
func ExampleCounter_Count() {
	plantNum, plantDen := poly.Poly{1}, poly.Poly{1, 1}
	c := delay.NewCounter(2)
	for _, kp := range []float64{-1.5, 1, 3} {
		f := stability.Function{
			P:     poly.Mul(poly.Poly{1}, plantDen),  // Dc·D, Dc = 1
			Q:     poly.Mul(poly.Poly{kp}, plantNum), // Nc·N, Nc = kp
			Delay: 1,
		}
		v := c.Count(f)
		fmt.Printf("kp = %4.1f: %d unstable, %s\n", kp, v.Unstable, v.Class())
	}
	// Output:
	// kp = -1.5: 1 unstable, unstable
	// kp =  1.0: 0 unstable, stable
	// kp =  3.0: 2 unstable, unstable
}

// The edge at the upper gain limit of the same loop is a complex pair at
// ω = α1 ≈ 2.0288 rad/s, tan α1 = −α1.
func ExampleTest_Classify() {
	f := stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{2.2618262}, Delay: 1}
	x := delay.Test{}.Classify(f, f)
	fmt.Printf("%v at ω = %.4f\n", x.Kind, x.Omega)
	// Output:
	// complex at ω = 2.0288
}

// An ideal derivative on a first-order plant makes the loop of neutral
// type; |kd| > 1 leaves infinitely many roots on the right.
func ExampleTest_Report() {
	f := stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{0.5, 1.5}, Delay: 1}
	rep := delay.Test{}.Report(f)
	fmt.Println(rep.Class(), rep.Unstable == delay.InfinitelyMany)
	fmt.Println(rep.Notes)
	// Output:
	// unstable true
	// [neutral type: deg P = deg Q = 1, |q_n/p_n| = 1.5 |q_n/p_n| > 1: infinitely many roots in the right half plane]
}

func ExampleRightmost() {
	// s + e^(−s) = 0: the rightmost pair is W_0(−1) = −0.3181 ± 1.3372j.
	f := stability.Function{P: poly.Poly{0, 1}, Q: poly.Poly{1}, Delay: 1}
	roots, err := delay.Rightmost(f, 2)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f\n", roots)
	fmt.Printf("decay rate %.4f, least damping %.4f\n", delay.DecayRate(roots), delay.LeastDamping(roots))
	// Output:
	// [(-0.3181+1.3372i) (-0.3181-1.3372i)]
	// decay rate 0.3181, least damping 0.2314
}

func ExamplePade() {
	num, den := delay.Pade(2, 2)
	fmt.Println(num, "over", den)
	fmt.Println("order for ωL up to 6:", delay.PadeOrder(6))
	// Output:
	// 0.333333·s^2 - s + 1 over 0.333333·s^2 + s + 1
	// order for ωL up to 6: 5
}

func ExampleDelayMargin() {
	// P control, kp = 2, of e^(−s)/(s + 1): crossover at √3 rad/s.
	num, den := poly.Poly{2}, poly.Poly{1, 1}
	for _, c := range delay.GainCrossovers(num, den, 1) {
		fmt.Printf("ωc = %.4f, phase margin %.4f rad, delay margin %.4f s\n", c.Omega, c.PhaseMargin, c.DelayMargin())
	}
	// Output:
	// ωc = 1.7321, phase margin 0.3623 rad, delay margin 0.2092 s
}
