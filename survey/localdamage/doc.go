// Package localdamage assesses local corrosion: statistics of a grid of
// thickness readings, the extreme-value (Gumbel) estimate of the deepest pit
// over an area, the API 653 §4.4.7 minimum remaining thickness of a tank
// bottom, the remaining strength of a corroded pipe by ASME B31G-2012
// (original and modified), and the section properties of a member from its
// plates with their loss against nominal. It does no I/O: every function takes
// values and returns values with the steps a report prints.
//
// Units: thicknesses, depths and lengths in mm, pressures and stresses in MPa,
// rates in mm/y, areas in any one unit (only their ratio is used).
package localdamage
