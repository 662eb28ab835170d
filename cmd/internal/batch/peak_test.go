package batch

import (
	"bytes"
	"os"
	"runtime/metrics"
	"strconv"
	"time"
)

// peakSampler records the largest heap (objects live or awaiting collection) seen
// while it runs, from runtime/metrics, which does not stop the world.
type peakSampler struct {
	stop chan struct{}
	done chan uint64
}

func startPeakSampler() *peakSampler {
	s := &peakSampler{stop: make(chan struct{}), done: make(chan uint64)}
	go func() {
		sample := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
		var peak uint64
		t := time.NewTicker(2 * time.Millisecond)
		defer t.Stop()
		for {
			metrics.Read(sample)
			peak = max(peak, sample[0].Value.Uint64())
			select {
			case <-s.stop:
				s.done <- peak
				return
			case <-t.C:
			}
		}
	}()
	return s
}

// Stop ends sampling and returns the peak in bytes.
func (s *peakSampler) Stop() uint64 {
	close(s.stop)
	return <-s.done
}

// resetPeakRSS resets the process's peak resident set (Linux: writing 5 to
// /proc/self/clear_refs); elsewhere it does nothing.
func resetPeakRSS() { _ = os.WriteFile("/proc/self/clear_refs", []byte("5"), 0) }

// peakRSS is the process's peak resident set in bytes since the last reset (Linux
// VmHWM), or 0 where it cannot be read.
func peakRSS() uint64 {
	data, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return 0
	}
	for _, line := range bytes.Split(data, []byte("\n")) {
		if v, ok := bytes.CutPrefix(line, []byte("VmHWM:")); ok {
			f := bytes.Fields(v)
			if len(f) == 2 && string(f[1]) == "kB" {
				n, err := strconv.ParseUint(string(f[0]), 10, 64)
				if err == nil {
					return n << 10
				}
			}
		}
	}
	return 0
}
