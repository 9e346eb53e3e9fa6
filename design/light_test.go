//go:build !heavy

package design

const heavy = false
