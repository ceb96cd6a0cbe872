// Package wallloss computes corrosion rates, remaining life, retirement and
// next-inspection dates from thickness readings. It does no I/O and reads no
// clock: every date it needs comes in with its input.
//
// The formulas are those of the in-service inspection codes (API 570 §7.1.1,
// API 510 §7.1.1): long-term rate from the earliest reading, short-term rate
// from the previous one, remaining life = (t_actual − t_required) / rate.
package wallloss
