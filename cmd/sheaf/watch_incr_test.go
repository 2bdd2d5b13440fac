package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// newTestWatcher copies testdata/batch/tie.sheaf into a temporary folder
// and returns a watcher of it that has done its first run (no fsnotify:
// the test calls run itself, as the event loop does after the quiet time).
func newTestWatcher(t testing.TB, out, errs io.Writer) (*watcher, string, string) {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("testdata", "batch", "tie.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "tie.sheaf")
	if err := os.WriteFile(path, src, 0o644); err != nil {
		t.Fatal(err)
	}
	o := &watchOptions{interval: 20 * time.Millisecond, rtol: 1e-6}
	w := &watcher{a: &app{stdin: strings.NewReader(""), stdout: out, stderr: errs}, o: o, path: path,
		dirs: map[string]bool{}, names: map[string]bool{}, settle: settleTime(o.interval)}
	w.run()
	return w, path, string(src)
}

// TestWatchIncremental: a save that changes only input values is
// recomputed through the kept State, with no compile, and gives the
// values a full compile gives; any other edit compiles the sheet.
func TestWatchIncremental(t *testing.T) {
	var out, errb syncBuffer
	w, path, src := newTestWatcher(t, &out, &errb)
	steps := []struct {
		name, from, to string
		compiles       int // full compiles after this save
		want           string
	}{
		{"one input", "P [kN] = 30 kN ", "P [kN] = 45 kN ", 1, "P  30 kN → 45 kN"},
		{"two inputs, other unit", "d [mm] = 20 mm ", "d [mm] = 0.024 m", 1, "d  20 mm → 24 mm"},
		{"back to the written value", "P [kN] = 45 kN ", "P [kN] = 30 kN ", 1, "P  45 kN → 30 kN"},
		{"a formula", "u [mm] = P * L / (E * A)", "u [mm] = 2 * P * L / (E * A)", 2, "formulas changed"},
		{"an input after a compile", "L [m] = 4.2 m ", "L [m] = 5 m   ", 2, "L  4.2 m → 5 m"},
		{"a value of another dimension", "L [m] = 5 m   ", "L [m] = 5 kN  ", 3, ""},
		{"a description", "-- rod length", "-- rod length, pin to pin", 4, ""},
	}
	cur := src
	for _, s := range steps {
		if !strings.Contains(cur, s.from) {
			t.Fatalf("%s: the sheet has no %q", s.name, s.from)
		}
		cur = strings.Replace(cur, s.from, s.to, 1)
		if err := os.WriteFile(path, []byte(cur), 0o644); err != nil {
			t.Fatal(err)
		}
		before := len(out.String())
		w.run()
		if w.compiles != s.compiles {
			t.Errorf("%s: %d full compiles, want %d", s.name, w.compiles, s.compiles)
		}
		if got := out.String()[before:]; s.want != "" && !strings.Contains(got, s.want) {
			t.Errorf("%s: output lacks %q:\n%s", s.name, s.want, got)
		}
	}
	// The kept State gives what a fresh compile of the same text gives.
	inc := w.last
	w.st, w.sheet = nil, nil
	w.src = nil
	w.run()
	full := w.last
	for i := range full.Cells {
		a, b := inc.Cells[i], full.Cells[i]
		if a.Cell.Name != b.Cell.Name || a.Known != b.Known || (a.Known && a.Text != b.Text) {
			t.Errorf("%s: incremental %q, full %q", b.Cell.Name, a.Text, b.Text)
		}
	}
}

// TestWatchScriptedEditor drives the watcher through fsnotify the way
// editors save: an atomic save (write a temporary file, rename it over
// the sheet), an in-place save in two writes 40 ms apart (truncate and
// write half, then the rest), a delete and re-create. None of them may be
// reported as cells removed or added: the sheet's cells stay the same.
func TestWatchScriptedEditor(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("testdata", "batch", "tie.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "tie.sheaf")
	if err := os.WriteFile(path, src, 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb syncBuffer
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	ready := make(chan struct{})
	done := make(chan error, 1)
	go func() {
		done <- runWatch(ctx, a, &watchOptions{interval: 100 * time.Millisecond, rtol: 1e-6}, path, func() { close(ready) })
	}()
	select {
	case <-ready:
	case <-time.After(10 * time.Second):
		t.Fatalf("the watcher did not start: %s", errb.String())
	}
	text := string(src)
	save := []struct {
		name string
		load string
		do   func(t *testing.T, b []byte)
	}{
		{"atomic", "35 kN", func(t *testing.T, b []byte) {
			tmp := filepath.Join(dir, ".tie.sheaf.tmp")
			if err := os.WriteFile(tmp, b, 0o644); err != nil {
				t.Fatal(err)
			}
			if err := os.Rename(tmp, path); err != nil {
				t.Fatal(err)
			}
		}},
		{"in place, two writes 40 ms apart", "40 kN", func(t *testing.T, b []byte) {
			f, err := os.OpenFile(path, os.O_WRONLY|os.O_TRUNC, 0o644)
			if err != nil {
				t.Fatal(err)
			}
			half := len(b) / 2
			if _, err := f.Write(b[:half]); err != nil {
				t.Fatal(err)
			}
			_ = f.Sync()
			time.Sleep(40 * time.Millisecond)
			if _, err := f.Write(b[half:]); err != nil {
				t.Fatal(err)
			}
			if err := f.Close(); err != nil {
				t.Fatal(err)
			}
		}},
		{"delete and re-create", "45 kN", func(t *testing.T, b []byte) {
			if err := os.Remove(path); err != nil {
				t.Fatal(err)
			}
			time.Sleep(40 * time.Millisecond)
			if err := os.WriteFile(path, b, 0o644); err != nil {
				t.Fatal(err)
			}
		}},
	}
	prev := "30 kN"
	for i, s := range save {
		text = strings.Replace(text, "P [kN] = "+prev, "P [kN] = "+s.load, 1)
		s.do(t, []byte(text))
		waitFor(t, &out, "P  "+prev+" → "+s.load)
		prev = s.load
		if i == len(save)-1 {
			time.Sleep(300 * time.Millisecond) // let a late spurious run show
		}
	}
	got := out.String()
	for _, bad := range []string{"cells removed", "cells added", "formulas changed"} {
		if strings.Contains(got, bad) {
			t.Errorf("a save was reported as %q:\n%s\nstderr:\n%s", bad, got, errb.String())
		}
	}
	if strings.Contains(errb.String(), "problem") {
		t.Errorf("a half-written file was reported as broken:\n%s", errb.String())
	}
	if n := strings.Count(got, "== run "); n != len(save) {
		t.Errorf("%d runs after %d saves:\n%s", n, len(save), got)
	}
	cancel()
	if err := <-done; err != nil {
		t.Error(err)
	}
}

// BenchmarkWatchSaveToResult times a save of an input value to the
// printed result, as the event loop runs it once the quiet time (--interval,
// 100 ms by default, not included) has passed: the two reads 10 ms apart
// that must agree, the incremental recompute through the kept State and
// the printed changes. BenchmarkWatchRecompute is the same without the
// settle read, which is what the engine costs; BenchmarkWatchFullCompile
// edits a formula, which compiles the sheet whole, for comparison.
func BenchmarkWatchSaveToResult(b *testing.B) { benchWatch(b, true, false) }

// BenchmarkWatchRecompute: see BenchmarkWatchSaveToResult.
func BenchmarkWatchRecompute(b *testing.B) { benchWatch(b, false, false) }

// BenchmarkWatchFullCompile: see BenchmarkWatchSaveToResult.
func BenchmarkWatchFullCompile(b *testing.B) { benchWatch(b, false, true) }

func benchWatch(b *testing.B, settle, formula bool) {
	w, path, src := newTestWatcher(b, io.Discard, io.Discard)
	w.settle = settleTime(100 * time.Millisecond) // the default --interval
	if !settle {
		w.settle = 0
	}
	loads := []string{"P [kN] = 31 kN ", "P [kN] = 32 kN "}
	texts := make([][]byte, 2)
	for i, l := range loads {
		t := strings.Replace(src, "P [kN] = 30 kN ", l, 1)
		if formula {
			t = strings.Replace(t, "u [mm] = P * L", []string{"u [mm] = 1 * P * L", "u [mm] = 2 * P * L"}[i], 1)
		}
		texts[i] = []byte(t)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		if err := os.WriteFile(path, texts[i%2], 0o644); err != nil {
			b.Fatal(err)
		}
		b.StartTimer()
		w.run()
	}
	b.StopTimer()
	// The last save set P; the sheet's N_Rd does not depend on it, u does.
	// Source: u = P·L/(E·A), by hand, with A = π·(20 mm)²/4.
	p := []float64{31e3, 32e3}[(b.N-1)%2]
	k := []float64{1, 2}[(b.N-1)%2]
	if !formula {
		k = 1
	}
	want := k * p * 4.2 / (210e9 * math.Pi * 0.02 * 0.02 / 4)
	if c := w.last.Cell("u"); c == nil || !c.Known || math.Abs(c.SI-want) > 1e-12*want {
		b.Fatalf("u = %v, want %g m", c, want)
	}
	if !formula && w.compiles != 1 {
		b.Fatalf("%d full compiles for input edits, want 1", w.compiles)
	}
}

// BenchmarkWatchLargeSheet: an input edit in a generated sheet of 20,000
// inputs and 20,000 derived cells, recomputed through the kept State
// (incremental) or compiled whole (full), settle read left out.
func BenchmarkWatchLargeSheet(b *testing.B) {
	var sb strings.Builder
	const n = 20000
	for i := 0; i < n; i++ {
		fmt.Fprintf(&sb, "x_%d [kN] = %d kN\ny_%d [kN] = 2 * x_%d\n", i, i+1, i, i)
	}
	src := sb.String()
	for _, mode := range []string{"incremental", "full"} {
		b.Run(mode, func(b *testing.B) {
			path := filepath.Join(b.TempDir(), "big.sheaf")
			if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
				b.Fatal(err)
			}
			o := &watchOptions{interval: 100 * time.Millisecond, rtol: 1e-6}
			w := &watcher{a: &app{stdin: strings.NewReader(""), stdout: io.Discard, stderr: io.Discard}, o: o, path: path,
				dirs: map[string]bool{}, names: map[string]bool{}}
			w.run()
			texts := [][]byte{[]byte(strings.Replace(src, "x_7 [kN] = 8 kN", "x_7 [kN] = 9 kN", 1)),
				[]byte(strings.Replace(src, "x_7 [kN] = 8 kN", "x_7 [kN] = 10 kN", 1))}
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				b.StopTimer()
				if err := os.WriteFile(path, texts[i%2], 0o644); err != nil {
					b.Fatal(err)
				}
				if mode == "full" {
					w.st = nil // forces the compile
				}
				b.StartTimer()
				w.run()
			}
			b.StopTimer()
			// Source: y_7 = 2 · x_7, by hand.
			want := []float64{18e3, 20e3}[(b.N-1)%2]
			if c := w.last.Cell("y_7"); c == nil || c.SI != want {
				b.Fatalf("y_7 = %v, want %g N", c, want)
			}
		})
	}
}
