// Package engine is the front door of Sheaf: it loads a sheet, checks it,
// and evaluates it.
//
//	s, err := engine.Load("hanger.sheaf")      // err is a diag.List for sheet errors
//	res := s.Run(nil)                          // or st := s.NewState(); st.Set(...); st.Eval()
//
// A Sheet is immutable and safe for concurrent use; a State holds one set
// of values and recomputes only what lies downstream of the inputs changed
// since its last Eval. Results carry every cell's value in SI and in its
// display unit, the design checks with their utilisation, and the run-time
// problems (a division by zero, a lookup outside a table), each reported at
// its cell, with every cell that uses a failed cell skipped silently.
//
// Values are shown with DefaultSigFigs significant figures: four, so that
// a utilisation of 0.9996 does not print as 1.00 and engineers reading a
// listing see the digit that decides a check, while staying within the
// precision of the inputs of a design calculation.
package engine
