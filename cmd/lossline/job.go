package main

import "github.com/lossline/lossline/findings"

// findings are the settings the computation follows.
func (s settings) findings() findings.Settings {
	return findings.Settings{Policy: s.Policy, AccelerationPct: s.AccelerationPct, Plan: s.Plan}
}
