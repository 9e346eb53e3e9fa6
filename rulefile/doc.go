// Package rulefile reads and writes quadwright rule files: the JSON format
// "quadwright-rule/1" of ../shared/CONTRACT.md, and plain text tables of
// node/weight pairs as users bring them from elsewhere.
//
// It is a writer package at the end of the road: it takes a finished
// design.Rule and never recomputes it; reading gives back the exact decimal
// strings, which audit and export take from there.
package rulefile
