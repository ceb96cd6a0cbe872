package plan

import "math"

// studentTCDF is P(T ≤ x) for Student's t with nu degrees of freedom (nu ≥ 1),
// by the finite series of Abramowitz and Stegun, Handbook of Mathematical
// Functions (1964), 26.7.3 (nu odd) and 26.7.4 (nu even), which are exact for
// whole degrees of freedom: with θ = arctan(|x|/√nu), A = P(|T| ≤ |x|) is
// (2/π)(θ + sin θ (cos θ + (2/3) cos³θ + …)) for odd nu and
// sin θ (1 + (1/2) cos²θ + (1·3)/(2·4) cos⁴θ + …) for even nu.
func studentTCDF(x float64, nu int) float64 {
	switch {
	case math.IsNaN(x) || nu < 1:
		return math.NaN()
	case math.IsInf(x, 1):
		return 1
	case math.IsInf(x, -1):
		return 0
	}
	th := math.Atan(math.Abs(x) / math.Sqrt(float64(nu)))
	s, c := math.Sincos(th)
	var a float64
	if nu%2 == 1 {
		var sum float64
		if nu > 1 {
			term := c
			sum = c
			for k := 3; k <= nu-2; k += 2 {
				term *= c * c * float64(k-1) / float64(k)
				sum += term
			}
		}
		a = 2 / math.Pi * (th + s*sum)
	} else {
		term, sum := 1.0, 1.0
		for k := 2; k <= nu-2; k += 2 {
			term *= c * c * float64(k-1) / float64(k)
			sum += term
		}
		a = s * sum
	}
	a = min(a, 1)
	if x < 0 {
		return (1 - a) / 2
	}
	return (1 + a) / 2
}

// normalCDF is P(Z ≤ x) for the standard normal distribution, through the
// complementary error function: Φ(x) = erfc(−x/√2)/2.
func normalCDF(x float64) float64 { return math.Erfc(-x/math.Sqrt2) / 2 }
