//go:build heavy

package design

// heavy widens the sweeps: go test -tags heavy ./design/
const heavy = true
