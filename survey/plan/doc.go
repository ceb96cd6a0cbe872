// Package plan turns assessed CMLs into risk and a repair plan an owner can
// fund: likelihood from remaining life, consequence from the checklist, a 5×5
// risk matrix, and the repairs that buy the most risk reduction for a budget
// in one year (a 0/1 knapsack) or over several years with retirement dates as
// deadlines. It does no I/O and reads no clock.
package plan
