package report

import (
	"bytes"
	"cmp"
	"context"
	"errors"
	"image"
	"image/png"
	"runtime"
	"sync"
	"sync/atomic"

	"git.sr.ht/~sbinet/gg"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgimg"

	"scaleplan/sweep"
)

// pngEncoder writes the PNG maps at the fastest deflate setting: a map's
// pixels are the same at every setting, only the file is a little larger,
// and encoding at the default setting took about a third of the time to
// draw the maps of a large study.
var pngEncoder = png.Encoder{CompressionLevel: png.BestSpeed}

// encodePNG encodes an image as PNG.
func encodePNG(img image.Image) ([]byte, error) {
	var buf bytes.Buffer
	if err := pngEncoder.Encode(&buf, img); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// newImageCanvas is a PNG map's canvas, drawing straight into one RGBA
// image of w × h at plotDPI. vgimg.NewWith would make the image and then
// copy it into its graphics context's own, so that every map being drawn
// held two (a band chart of many rows is some 5 MB each); the context is
// set up as NewWith sets up its own (butt line caps, y upwards).
func newImageCanvas(w, h vg.Length) (*vgimg.Canvas, *image.RGBA) {
	px := func(l vg.Length) int { return int(l/vg.Inch*vg.Length(plotDPI) + 0.5) }
	img := image.NewRGBA(image.Rect(0, 0, px(w), px(h)))
	ctx := gg.NewContextForRGBA(img)
	ctx.SetLineCapButt()
	ctx.InvertY()
	return vgimg.NewWith(vgimg.UseDPI(plotDPI), vgimg.UseImageWithContext(img, ctx)), img
}

// plotStrategies runs draw for every strategy of a result, at most
// GOMAXPROCS at a time (the strategies' maps are independent and each is
// written to its own file), and returns the files written in the
// strategies' order, the same order as if they had been drawn one after
// the other. On an error the others stop before their next map, and the
// files written are returned with the error (that of the first strategy
// in order that failed by itself rather than because another did).
func plotStrategies(ctx context.Context, res *sweep.Result, draw func(context.Context, int, *sweep.StrategyResult) ([]string, error)) ([]string, error) {
	n := len(res.Strategies)
	type result struct {
		files []string
		err   error
	}
	results := make([]result, n)
	inner := &stopCtx{Context: ctx}
	next := make(chan int)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				files, err := draw(inner, i, res.Strategies[i])
				results[i] = result{files, err}
				if err != nil {
					inner.stop.Store(true)
				}
			}
		}()
	}
	for i := range n {
		next <- i
	}
	close(next)
	wg.Wait()
	var files []string
	var first, induced error
	for _, r := range results {
		files = append(files, r.files...)
		switch {
		case r.err == nil:
		case errors.Is(r.err, errStopped):
			induced = cmp.Or(induced, r.err)
		default:
			first = cmp.Or(first, r.err)
		}
	}
	return files, cmp.Or(first, induced)
}

// errStopped stops a strategy's maps when another strategy's failed.
var errStopped = errors.New("stopped: another map failed")

// stopCtx is a context whose Err also reports errStopped once stop is set.
// It asks stop first, so a check that passes its parent is always
// followed by a map (an interrupt counted in checks stops after exactly
// that many maps).
type stopCtx struct {
	context.Context
	stop atomic.Bool
}

func (c *stopCtx) Err() error {
	if c.stop.Load() {
		return errStopped
	}
	return c.Context.Err()
}
