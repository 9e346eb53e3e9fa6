package moments

import (
	"fmt"
	"math/big"
	"strings"
	"unicode/utf8"

	"quadwright/precision"
)

// Expr is a parsed weight expression (CONTRACT.md, "Weight expressions"):
// numbers, the variables it was parsed with, the constants pi and e, the
// operators + - * / ^ and the functions of exprFuncs. It is a tree of
// arithmetic only; evaluating it runs nothing else.
//
// Subexpressions made of numbers, + - * / and integer powers are folded
// into exact rationals when parsed, so that 1/3 is exactly one third and
// 2^3^2 exactly 512, whatever the precision of a later evaluation.
//
// An Expr is immutable once parsed and safe for concurrent evaluation.
type Expr struct {
	src  string
	vars []string
	root *node
}

type opKind uint8

const (
	opConst  opKind = iota // exact rational constant (rat), float64 value f
	opPi                   // the constant pi
	opE                    // the constant e
	opVar                  // variable number v
	opNeg                  // -a
	opAdd                  // a + b
	opSub                  // a - b
	opMul                  // a * b
	opDiv                  // a / b
	opPow                  // a ^ b, b not a small integer constant
	opPowInt               // a ^ n, n a small integer (exact repeated products)
	opFunc                 // fn(a)
)

// node is one operation of the tree. pos is the 1-based character position
// of the operator, name or number in the source, for error messages.
type node struct {
	op   opKind
	a, b *node
	rat  *big.Rat
	f    float64
	n    int64
	v    int
	fn   string
	pos  int
}

// exprFuncs are the functions an expression may call, in the order of the
// help text.
var exprFuncs = []string{"exp", "log", "sqrt", "abs", "sin", "cos", "tan", "atan", "sinh", "cosh", "tanh"}

// Limits that keep a hostile or mistyped expression from exhausting memory
// or the stack; no weight a user means comes near them.
const (
	maxExprLen   = 10000 // characters
	maxExprDepth = 200   // nesting of parentheses, operators and calls
	maxPowInt    = 1 << 20
	maxFoldBits  = 1 << 16 // bits of a folded rational's numerator or denominator
)

func isFunc(name string) bool {
	for _, f := range exprFuncs {
		if f == name {
			return true
		}
	}
	return false
}

// ParseExpr parses the weight expression src in the variables vars (default
// {"x"}). Errors are one sentence that quotes src and gives the 1-based
// character position, as in
//
//	weight "x^^2": position 3: expected a number, a name or "(" after "^"
//
// ParseExpr never panics on any src. A variable name that is not a plain
// lower-case name, or that collides with a function or a constant, is a
// programmer error and panics.
func ParseExpr(src string, vars ...string) (*Expr, error) {
	if len(vars) == 0 {
		vars = []string{"x"}
	}
	for _, v := range vars {
		if v == "" || v == "pi" || v == "e" || isFunc(v) || strings.Trim(v, "abcdefghijklmnopqrstuvwxyz") != "" {
			panic(fmt.Sprintf("moments: ParseExpr with unusable variable name %q", v))
		}
	}
	p := &parser{src: src, vars: vars}
	if len(src) > maxExprLen {
		return nil, p.errorf(maxExprLen+1, "longer than %d characters", maxExprLen)
	}
	if strings.TrimSpace(src) == "" {
		return nil, fmt.Errorf("weight %s: the expression is empty", quoteExpr(src))
	}
	if err := p.lex(); err != nil {
		return nil, err
	}
	root, err := p.sum(0)
	if err != nil {
		return nil, err
	}
	if t := p.peek(); t.kind != tokEnd {
		if t.text == ")" {
			return nil, p.errorf(t.pos, "unmatched \")\"")
		}
		return nil, p.errorf(t.pos, "expected an operator or the end after %s, found %s", p.describePrev(), t.describe())
	}
	return &Expr{src: src, vars: append([]string(nil), vars...), root: root}, nil
}

// MustParseExpr is ParseExpr for expressions written in the program itself;
// an error panics.
func MustParseExpr(src string, vars ...string) *Expr {
	e, err := ParseExpr(src, vars...)
	if err != nil {
		panic("moments: " + err.Error())
	}
	return e
}

// String returns the source as given to ParseExpr.
func (e *Expr) String() string { return e.src }

// Vars returns the names of the variables, in the order Eval64 and EvalBig
// take their values.
func (e *Expr) Vars() []string { return append([]string(nil), e.vars...) }

func quoteExpr(src string) string {
	if len(src) > 60 {
		src = src[:60] + "..."
	}
	return fmt.Sprintf("%q", src)
}

type tokKind uint8

const (
	tokEnd tokKind = iota
	tokNum
	tokName
	tokOp // one of + - * / ^ ( )
)

type token struct {
	kind tokKind
	text string
	pos  int // 1-based
}

func (t token) describe() string {
	switch t.kind {
	case tokEnd:
		return "the end"
	case tokNum:
		return fmt.Sprintf("the number %q", t.text)
	case tokName:
		return fmt.Sprintf("the name %q", t.text)
	}
	return fmt.Sprintf("%q", t.text)
}

type parser struct {
	src  string
	vars []string
	toks []token
	i    int
}

// errorf formats a parse error at the byte offset pos-1 of the source,
// reported as a character position (counted in runes from 1).
func (p *parser) errorf(pos int, format string, args ...any) error {
	return fmt.Errorf("weight %s: position %d: %s", quoteExpr(p.src), charPos(p.src, pos), fmt.Sprintf(format, args...))
}

// charPos turns the 1-based byte position pos in src into a 1-based
// character position.
func charPos(src string, pos int) int {
	if pos-1 > len(src) {
		return utf8.RuneCountInString(src) + pos - len(src)
	}
	return utf8.RuneCountInString(src[:pos-1]) + 1
}

func (p *parser) peek() token { return p.toks[p.i] }

func (p *parser) next() token {
	t := p.toks[p.i]
	if t.kind != tokEnd {
		p.i++
	}
	return t
}

// describePrev names the token before the current one, for "after ..." in
// error messages.
func (p *parser) describePrev() string {
	if p.i == 0 {
		return "the start"
	}
	return p.toks[p.i-1].describe()
}

func isDigit(c byte) bool  { return '0' <= c && c <= '9' }
func isLetter(c byte) bool { return 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || c == '_' }

// lex splits the source into tokens. A number is digits with at most one
// decimal point, then optionally e or E, an optional sign and digits (the
// exponent is taken only when a digit follows, so "2e" is 2 followed by the
// constant e, which the parser then refuses as a missing operator).
func (p *parser) lex() error {
	s := p.src
	for i := 0; i < len(s); {
		c := s[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
		case isDigit(c) || c == '.':
			j := i
			for j < len(s) && (isDigit(s[j]) || s[j] == '.') {
				j++
			}
			if j < len(s) && (s[j] == 'e' || s[j] == 'E') {
				k := j + 1
				if k < len(s) && (s[k] == '+' || s[k] == '-') {
					k++
				}
				if k < len(s) && isDigit(s[k]) {
					for k < len(s) && isDigit(s[k]) {
						k++
					}
					j = k
				}
			}
			p.toks = append(p.toks, token{tokNum, s[i:j], i + 1})
			i = j
		case isLetter(c):
			j := i
			for j < len(s) && (isLetter(s[j]) || isDigit(s[j])) {
				j++
			}
			p.toks = append(p.toks, token{tokName, s[i:j], i + 1})
			i = j
		case c == '*' && i+1 < len(s) && s[i+1] == '*':
			return p.errorf(i+1, "\"**\" is not an operator here: write a power with \"^\", as in x^2")
		case strings.IndexByte("+-*/^()", c) >= 0:
			p.toks = append(p.toks, token{tokOp, s[i : i+1], i + 1})
			i++
		default:
			r := []rune(s[i:])[0]
			return p.errorf(i+1, "unexpected character %q", r)
		}
	}
	p.toks = append(p.toks, token{kind: tokEnd, pos: len(s) + 1})
	return nil
}

func (p *parser) isOp(t token, ops string) bool {
	return t.kind == tokOp && strings.Contains(ops, t.text)
}

// binaryOps maps the text of a binary operator to its operation.
var binaryOps = map[string]opKind{"+": opAdd, "-": opSub, "*": opMul, "/": opDiv}

// tooDeep refuses nesting beyond maxExprDepth, which would otherwise cost
// stack in proportion to the input.
func (p *parser) tooDeep(depth int) error {
	if depth > maxExprDepth {
		return p.errorf(p.peek().pos, "nested more than %d levels deep", maxExprDepth)
	}
	return nil
}

// sum := product (("+" | "-") product)*
func (p *parser) sum(depth int) (*node, error) { return p.leftAssoc(depth, "+-", p.product) }

// product := unary (("*" | "/") unary)*
func (p *parser) product(depth int) (*node, error) { return p.leftAssoc(depth, "*/", p.unary) }

// leftAssoc parses operand (ops operand)*, folding to the left.
func (p *parser) leftAssoc(depth int, ops string, operand func(int) (*node, error)) (*node, error) {
	if err := p.tooDeep(depth); err != nil {
		return nil, err
	}
	a, err := operand(depth + 1)
	if err != nil {
		return nil, err
	}
	for p.isOp(p.peek(), ops) {
		t := p.next()
		b, err := operand(depth + 1)
		if err != nil {
			return nil, err
		}
		a = fold(&node{op: binaryOps[t.text], a: a, b: b, pos: t.pos})
	}
	return a, nil
}

// unary := ("-" | "+") unary | power. Unary minus binds looser than "^":
// -x^2 is -(x^2).
func (p *parser) unary(depth int) (*node, error) {
	if err := p.tooDeep(depth); err != nil {
		return nil, err
	}
	if t := p.peek(); p.isOp(t, "+-") {
		p.next()
		a, err := p.unary(depth + 1)
		if err != nil {
			return nil, err
		}
		if t.text == "+" {
			return a, nil
		}
		return fold(&node{op: opNeg, a: a, pos: t.pos}), nil
	}
	return p.power(depth + 1)
}

// power := primary ("^" unary)?. The exponent is a unary, so "^" is
// right-associative (2^3^2 = 2^9) and an exponent may carry its own sign
// (x^-0.5, x^-y^2 = x^(-(y^2))).
func (p *parser) power(depth int) (*node, error) {
	if err := p.tooDeep(depth); err != nil {
		return nil, err
	}
	base, err := p.primary(depth + 1)
	if err != nil {
		return nil, err
	}
	if !p.isOp(p.peek(), "^") {
		return base, nil
	}
	t := p.next()
	exp, err := p.unary(depth + 1)
	if err != nil {
		return nil, err
	}
	return fold(&node{op: opPow, a: base, b: exp, pos: t.pos}), nil
}

// primary := number | constant | variable | function "(" sum ")" | "(" sum ")"
func (p *parser) primary(depth int) (*node, error) {
	t := p.peek()
	switch {
	case t.kind == tokNum:
		p.next()
		v, err := precision.ParseExact(t.text)
		if err != nil {
			return nil, p.errorf(t.pos, "%q is not a number", t.text)
		}
		return constNode(v, t.pos), nil
	case t.kind == tokName:
		p.next()
		for i, v := range p.vars {
			if t.text == v {
				return &node{op: opVar, v: i, pos: t.pos}, nil
			}
		}
		switch {
		case t.text == "pi":
			return &node{op: opPi, pos: t.pos}, nil
		case t.text == "e":
			return &node{op: opE, pos: t.pos}, nil
		case !isFunc(t.text):
			return nil, p.errorf(t.pos, "unknown name %q (known: %s)", t.text, p.knownNames())
		}
		open := p.peek()
		if !p.isOp(open, "(") {
			return nil, p.errorf(open.pos, "expected \"(\" after the function name %q", t.text)
		}
		p.next()
		arg, err := p.sum(depth + 1)
		if err != nil {
			return nil, err
		}
		if c := p.peek(); !p.isOp(c, ")") {
			return nil, p.errorf(c.pos, "expected \")\" to close \"(\" at position %d, found %s", open.pos, c.describe())
		}
		p.next()
		return &node{op: opFunc, fn: t.text, a: arg, pos: t.pos}, nil
	case p.isOp(t, "("):
		p.next()
		a, err := p.sum(depth + 1)
		if err != nil {
			return nil, err
		}
		if c := p.peek(); !p.isOp(c, ")") {
			return nil, p.errorf(c.pos, "expected \")\" to close \"(\" at position %d, found %s", t.pos, c.describe())
		}
		p.next()
		return a, nil
	}
	if t.kind == tokEnd {
		return nil, p.errorf(t.pos, "expected a number, a name or \"(\" after %s, found the end", p.describePrev())
	}
	return nil, p.errorf(t.pos, "expected a number, a name or \"(\" after %s", p.describePrev())
}

func (p *parser) knownNames() string {
	names := append(append([]string(nil), p.vars...), "pi", "e")
	return strings.Join(append(names, exprFuncs...), ", ")
}

func constNode(v *big.Rat, pos int) *node {
	f, _ := v.Float64()
	return &node{op: opConst, rat: v, f: f, pos: pos}
}

// fold replaces an operation on exact constants by its exact value, and a
// power with a small integer exponent by opPowInt, so that x^2 is x*x and
// not exp(2 log x). Division by an exact zero and 0 to a negative power are
// left unfolded: they are reported when the expression is evaluated.
func fold(n *node) *node {
	ca := n.a != nil && n.a.op == opConst
	cb := n.b != nil && n.b.op == opConst
	switch n.op {
	case opNeg:
		if ca {
			return constNode(new(big.Rat).Neg(n.a.rat), n.pos)
		}
	case opAdd, opSub, opMul, opDiv:
		if !ca || !cb || (n.op == opDiv && n.b.rat.Sign() == 0) {
			return n
		}
		r := new(big.Rat)
		switch n.op {
		case opAdd:
			r.Add(n.a.rat, n.b.rat)
		case opSub:
			r.Sub(n.a.rat, n.b.rat)
		case opMul:
			r.Mul(n.a.rat, n.b.rat)
		default:
			r.Quo(n.a.rat, n.b.rat)
		}
		if ratBits(r) <= maxFoldBits {
			return constNode(r, n.pos)
		}
	case opPow:
		if !cb || !n.b.rat.IsInt() || !n.b.rat.Num().IsInt64() {
			return n
		}
		k := n.b.rat.Num().Int64()
		if k > maxPowInt || k < -maxPowInt {
			return n
		}
		pi := &node{op: opPowInt, a: n.a, n: k, pos: n.pos}
		if !ca || (k < 0 && n.a.rat.Sign() == 0) {
			return pi
		}
		if est := int64(ratBits(n.a.rat)) * abs64(k); est > maxFoldBits {
			return pi
		}
		return constNode(ratPowInt(n.a.rat, k), n.pos)
	}
	return n
}

func ratBits(r *big.Rat) int { return max(r.Num().BitLen(), r.Denom().BitLen()) }

func abs64(v int64) int64 {
	if v < 0 {
		return -v
	}
	return v
}

// ratPowInt returns r^k exactly (r nonzero when k < 0).
func ratPowInt(r *big.Rat, k int64) *big.Rat {
	e := big.NewInt(abs64(k))
	num := new(big.Int).Exp(r.Num(), e, nil)
	den := new(big.Int).Exp(r.Denom(), e, nil)
	if k < 0 {
		num, den = den, num
		if den.Sign() < 0 {
			num.Neg(num)
			den.Neg(den)
		}
	}
	return new(big.Rat).SetFrac(num, den)
}
