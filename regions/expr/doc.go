// Package expr reads a plant typed by the user, either as a transfer
// function in s such as "2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))" (Parse),
// with a dead time as in "2*exp(-1.5*s)/((4*s+1)*(s+1))" (ParsePlant), or
// in z for a sampled-data plant (ParseIn), or as coefficient lists highest
// power first such as "1, 3.5, 0, 2" (ParseList), and checks that the
// result is a plant the stability computations can use (Check).
//
// Both readers return polynomials in the ascending order of package poly.
// Errors in the text are *SyntaxError values that carry the input and the
// column of the problem, and say what was expected or found there.
package expr
