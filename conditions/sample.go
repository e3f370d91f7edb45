package conditions

import (
	"math"
	"math/rand/v2"
	"runtime"
	"sync"

	"github.com/sheaf-calc/sheaf/engine"
	"gonum.org/v1/gonum/stat/distuv"
)

// chunk is the number of samples drawn from one seeded stream. Chunks are
// the unit of parallel work and are combined in their order, so the
// figures do not depend on the number of cores.
const chunk = 4096

// tally is what one chunk of samples gave.
type tally struct {
	fails, errors []int     // by check
	n             []int     // by result: samples with a value
	mean, m2      []float64 // by result: running mean and sum of squared deviations
}

// sample draws the Monte Carlo samples: every toleranced input from its
// distribution in each sample, the checks' failures and the results'
// means and spreads counted, in parallel over chunks.
func (sp *Spread) sample(p *engine.Program) {
	if len(sp.Checks)+len(sp.Results) == 0 {
		return
	}
	chunks := (sp.Samples + chunk - 1) / chunk
	tallies := make([]tally, chunks)
	next := make(chan int)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), chunks) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			d := sp.newDrawer(p)
			for c := range next {
				tallies[c] = d.run(sp, c)
			}
		}()
	}
	for c := range chunks {
		next <- c
	}
	close(next)
	wg.Wait()
	sp.combine(tallies)
}

// drawer is one worker's frame, quantile functions and input set.
type drawer struct {
	p     *engine.Program
	f     *engine.Frame
	quant []func(float64) float64
	sets  []engine.Set
}

func (sp *Spread) newDrawer(p *engine.Program) *drawer {
	d := &drawer{p: p, f: p.NewFrame()}
	p.Run(d.f, nil)
	for _, in := range sp.Inputs {
		d.quant = append(d.quant, quantile(in.Tol, d.f.Values[in.Index]))
		d.sets = append(d.sets, engine.Set{Slot: in.Index})
	}
	return d
}

// run draws chunk c: its samples come from a stream seeded with the
// sheet's seed and the chunk's number.
func (d *drawer) run(sp *Spread, c int) tally {
	rng := rand.New(rand.NewPCG(sp.Seed, uint64(c)))
	n := min(chunk, sp.Samples-c*chunk)
	t := tally{fails: make([]int, len(sp.Checks)), errors: make([]int, len(sp.Checks)),
		n: make([]int, len(sp.Results)), mean: make([]float64, len(sp.Results)), m2: make([]float64, len(sp.Results))}
	for range n {
		for i := range d.sets {
			u := rng.Float64()
			for u == 0 {
				u = rng.Float64()
			}
			d.sets[i].SI = d.quant[i](u)
		}
		d.p.Run(d.f, d.sets)
		for k := range sp.Checks {
			switch d.f.Status[sp.Checks[k].Stmt.Index] {
			case engine.Pass:
			case engine.Fail:
				t.fails[k]++
			default:
				t.errors[k]++
			}
		}
		for k := range sp.Results {
			slot := sp.Results[k].Stmt.Index
			if d.f.Status[slot] != engine.OK {
				continue
			}
			// Welford's running mean and variance.
			t.n[k]++
			x := d.f.Values[slot]
			delta := x - t.mean[k]
			t.mean[k] += delta / float64(t.n[k])
			t.m2[k] += delta * (x - t.mean[k])
		}
	}
	return t
}

// combine adds the chunks up in order: counts, and means and variances by
// the pairwise rule of Chan, Golub and LeVeque.
func (sp *Spread) combine(ts []tally) {
	for k := range sp.Checks {
		fails, errs := 0, 0
		for _, t := range ts {
			fails += t.fails[k]
			errs += t.errors[k]
		}
		c := &sp.Checks[k]
		c.Errors = errs
		c.Fail, c.FailLo, c.FailHi = wilson(fails+errs, sp.Samples)
	}
	for k := range sp.Results {
		var n int
		var mean, m2 float64
		for _, t := range ts {
			if t.n[k] == 0 {
				continue
			}
			nb := t.n[k]
			delta := t.mean[k] - mean
			tot := n + nb
			mean += delta * float64(nb) / float64(tot)
			m2 += t.m2[k] + delta*delta*float64(n)*float64(nb)/float64(tot)
			n = tot
		}
		r := &sp.Results[k]
		r.Mean, r.SD = mean, math.NaN()
		if n > 1 {
			r.SD = math.Sqrt(m2 / float64(n-1))
		}
	}
}

// wilson returns the share k/n and its 95 % Wilson score interval, which
// stays inside 0–1 and is sound for shares near either end.
func wilson(k, n int) (p, lo, hi float64) {
	if n == 0 {
		return math.NaN(), math.NaN(), math.NaN()
	}
	z := distuv.UnitNormal.Quantile(0.975)
	fn := float64(n)
	p = float64(k) / fn
	den := 1 + z*z/fn
	mid := (p + z*z/(2*fn)) / den
	half := z * math.Sqrt(p*(1-p)/fn+z*z/(4*fn*fn)) / den
	return p, math.Max(0, mid-half), math.Min(1, mid+half)
}
