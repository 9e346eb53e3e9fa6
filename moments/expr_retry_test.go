package moments

import (
	"math/big"
	"strings"
	"testing"
)

// TestEvalBigCancellingDivisor: x/(exp(x)-1) at x = 1e-138 is 1 - x/2 + ...
// (its Taylor series, common practice), though exp(x)-1 is exactly 0 at
// 128 bits. The retry at 512 bits keeps 512 - 458 = 54 bits of the
// difference, so the value is good to about 1e-16 relative: enough where
// such points sit (next to an end, where the quadrature's dx/dt is as
// small as x); a divisor that is zero at every precision stays an error.
func TestEvalBigCancellingDivisor(t *testing.T) {
	e, err := ParseExpr("x/(exp(x)-1)")
	if err != nil {
		t.Fatal(err)
	}
	x, _, _ := big.ParseFloat("1e-138", 10, 128, big.ToNearestEven)
	v, err := e.EvalBig(128, x)
	if err != nil {
		t.Fatal(err)
	}
	d := new(big.Float).Sub(v, big.NewFloat(1))
	if f, _ := d.Float64(); f > 1e-15 || f < -1e-15 {
		t.Errorf("x/(exp(x)-1) at 1e-138 = %s", v.Text('g', 30))
	}
	z, _ := ParseExpr("1/(x-x)")
	if _, err := z.EvalBig(64, x); err == nil || !strings.Contains(err.Error(), "division by zero") {
		t.Errorf("1/(x-x): error %v", err)
	}
}
