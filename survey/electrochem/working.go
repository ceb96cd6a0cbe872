package electrochem

import "fmt"

// Working is how a result was reached: the formula with numbers, in order,
// and the published source of the method.
type Working struct {
	Source string
	Steps  []string
}

func (w *Working) step(format string, a ...any) { w.Steps = append(w.Steps, fmt.Sprintf(format, a...)) }
