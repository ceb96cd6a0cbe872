// Package required computes minimum required thickness from design data with
// the formula of the governing code, keeping every input and step so that a
// report can show how the number was reached. It does no I/O.
//
// Methods: ASME B31.3 §304.1.2 straight pipe under internal pressure; API 653
// §4.3.3.1 tank shell course (whole course and locally thinned area); API 653
// §4.4.7 / Table 4.4 tank bottom minimum remaining thickness; and a structural
// member's allowed section loss set by the responsible engineer.
package required
