package report

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"errors"
	"fmt"
	"hash"
	"hash/crc32"
	"io"
	"io/fs"
	"sort"
	"strings"

	"github.com/xuri/excelize/v2"

	"scaleplan/sweep"
)

// zipLevel is the deflate level of the workbook's parts. Level 2 of Go's
// compressor packs the sheets' XML about 15 % larger than the default
// level 6 in a sixth of the time (measured on the map sheets of the
// 32-million-point synthetic study: 6.6 against 5.7 MB, 0.29 against
// 1.7 s).
const zipLevel = 2

// xlsxZip is the archive writer the spreadsheet library writes the
// workbook through (excelize.File.SetZipWriter). It compresses each part
// once, as it arrives, and writes the archive when closed, with the parts
// in name order (the library writes streamed sheets in map order), so the
// same result gives a byte-identical file. On the way it fixes the two
// things the library leaves to chance or unfinished:
//
//   - the content-types part lists its Default entries sorted (the
//     library lists image types in map order);
//   - a streamed sheet that still declares the dimension "A1" (the stream
//     writer declares it before any row is written) gets the range its
//     cells cover. Such a sheet is held uncompressed until it is complete;
//     the long sheets declare their dimension up front (newSheetSized) and
//     are compressed as they stream.
//
// Images are stored, not deflated again.
type xlsxZip struct {
	w     io.Writer
	parts []*zipPart
	cur   *zipPart
	fw    *flate.Writer
	// rows are the rows of sheets written straight into their part, by
	// part name (see rowsFunc); each is used once.
	rows map[string]rowsFunc
}

// zipPart is one part of the archive.
type zipPart struct {
	name   string
	method uint16
	crc    hash.Hash32
	size   uint64
	data   bytes.Buffer // the compressed (or stored) bytes
	// hold keeps the uncompressed bytes while a fix may still apply; nil
	// when the part streams into data.
	hold    *bytes.Buffer
	fix     func([]byte) []byte
	decided bool // a sheet: whether its dimension needs fixing is known
	// rows writes the sheet's rows before its end of sheet data (the part
	// is then held, only its frame, until complete).
	rows rowsFunc
}

// Create starts a part; the previous one is complete.
func (z *xlsxZip) Create(name string) (io.Writer, error) {
	if err := z.finish(); err != nil {
		return nil, err
	}
	p := &zipPart{name: name, method: zip.Deflate, crc: crc32.NewIEEE()}
	lower := strings.ToLower(name)
	switch {
	case name == "[Content_Types].xml":
		p.hold, p.fix, p.decided = new(bytes.Buffer), sortDefaults, true
	case z.rows[name] != nil:
		p.hold, p.decided, p.rows = new(bytes.Buffer), true, z.rows[name]
		delete(z.rows, name)
	case sheetPartRE.MatchString(name):
		p.hold = new(bytes.Buffer)
	case strings.HasPrefix(lower, "xl/media/") && (strings.HasSuffix(lower, ".png") || strings.HasSuffix(lower, ".jpeg") || strings.HasSuffix(lower, ".jpg")):
		p.method = zip.Store
	}
	if p.method == zip.Deflate && p.hold == nil {
		if err := z.startDeflate(p); err != nil {
			return nil, err
		}
	}
	z.parts = append(z.parts, p)
	z.cur = p
	return z, nil
}

// startDeflate points the one compressor at a part.
func (z *xlsxZip) startDeflate(p *zipPart) error {
	if z.fw == nil {
		fw, err := flate.NewWriter(&p.data, zipLevel)
		if err != nil {
			return err
		}
		z.fw = fw
		return nil
	}
	z.fw.Reset(&p.data)
	return nil
}

// Write adds bytes to the current part.
func (z *xlsxZip) Write(b []byte) (int, error) {
	p := z.cur
	if p == nil {
		return 0, errors.New("workbook archive: write before any part")
	}
	if p.hold == nil {
		return len(b), z.emit(p, b)
	}
	p.hold.Write(b)
	if !p.decided {
		h := p.hold.Bytes()
		if bytes.Contains(h, []byte("<sheetData")) || bytes.Contains(h, []byte("</worksheet>")) {
			p.decided = true
			if loc := dimensionRE.FindIndex(h); loc != nil && bytes.Contains(h[loc[0]:loc[1]], []byte(`ref="A1"`)) {
				p.fix = fixDimension // held until complete
			} else {
				// The dimension was declared up front: stream.
				held := p.hold.Bytes()
				p.hold = nil
				if err := z.startDeflate(p); err != nil {
					return 0, err
				}
				return len(b), z.emit(p, held)
			}
		}
	}
	return len(b), nil
}

// emit compresses (or stores) bytes of a streaming part.
func (z *xlsxZip) emit(p *zipPart, b []byte) error {
	p.crc.Write(b)
	p.size += uint64(len(b))
	if p.method == zip.Store {
		_, err := p.data.Write(b)
		return err
	}
	_, err := z.fw.Write(b)
	return err
}

// finish completes the current part.
func (z *xlsxZip) finish() error {
	p := z.cur
	if p == nil {
		return nil
	}
	z.cur = nil
	if p.hold != nil {
		b := p.hold.Bytes()
		if p.fix != nil {
			b = p.fix(b)
		}
		p.hold = nil
		if p.method == zip.Deflate {
			if err := z.startDeflate(p); err != nil {
				return err
			}
		}
		if p.rows != nil {
			if err := z.emitRows(p, b); err != nil {
				return err
			}
		} else if err := z.emit(p, b); err != nil {
			return err
		}
	}
	if p.method == zip.Deflate {
		return z.fw.Close()
	}
	return nil
}

// sheetDataEnd ends a sheet's rows.
var sheetDataEnd = []byte("</sheetData>")

// emitRows compresses a sheet's frame b with its rows written in before
// the end of its sheet data.
func (z *xlsxZip) emitRows(p *zipPart, b []byte) error {
	i := bytes.Index(b, sheetDataEnd)
	if i < 0 || bytes.Count(b, sheetDataEnd) != 1 {
		return fmt.Errorf("workbook archive: %s: no single end of sheet data to write the rows before", p.name)
	}
	if err := z.emit(p, b[:i]); err != nil {
		return err
	}
	if err := p.rows(emitter{z, p}); err != nil {
		return err
	}
	return z.emit(p, b[i:])
}

// emitter writes to a streaming part.
type emitter struct {
	z *xlsxZip
	p *zipPart
}

func (e emitter) Write(b []byte) (int, error) { return len(b), e.z.emit(e.p, b) }

// AddFS is part of the library's archive interface; the workbook never
// adds a file system.
func (z *xlsxZip) AddFS(fs.FS) error {
	return errors.New("workbook archive: adding a file system is not supported")
}

// Close writes the archive, parts in name order (the content-types part
// first).
func (z *xlsxZip) Close() error {
	if err := z.finish(); err != nil {
		return err
	}
	for name := range z.rows {
		return fmt.Errorf("workbook archive: the sheet part %s was never written", name)
	}
	parts := append([]*zipPart(nil), z.parts...)
	sort.SliceStable(parts, func(i, j int) bool { return zipOrder(parts[i].name) < zipOrder(parts[j].name) })
	zw := zip.NewWriter(z.w)
	for _, p := range parts {
		w, err := zw.CreateRaw(&zip.FileHeader{Name: p.name, Method: p.method, CRC32: p.crc.Sum32(),
			CompressedSize64: uint64(p.data.Len()), UncompressedSize64: p.size})
		if err != nil {
			return err
		}
		if _, err := w.Write(p.data.Bytes()); err != nil {
			return err
		}
		p.data = bytes.Buffer{}
	}
	z.parts = nil
	return zw.Close()
}

// newSheetSized starts a long sheet of rows rows (the header included) and
// cols columns whose size is known before it is written: it declares its
// dimension up front, so the archive writer compresses it as it streams
// rather than holding it to fix the dimension.
func newSheetSized(f *excelize.File, name string, header []string, widths []float64, bold, rows, cols int) (*sheetWriter, error) {
	if i, _ := f.GetSheetIndex(name); i < 0 {
		if _, err := f.NewSheet(name); err != nil {
			return nil, err
		}
	}
	if rows > 0 && cols > 0 {
		last, err := excelize.CoordinatesToCellName(cols, rows)
		if err != nil {
			return nil, err
		}
		if err := f.SetSheetDimension(name, "A1:"+last); err != nil {
			return nil, err
		}
	}
	return newSheet(f, name, header, widths, bold)
}

// limitNames are a combination's texts for the limit that gives a margin
// in a map sheet, feasible and infeasible.
type limitNames struct {
	feasible, infeasible []string // by limit index
	other, otherBad      string   // the similarity condition
}

func newLimitNames(c *sweep.ComboResult) limitNames {
	n := limitNames{other: "similarity condition", otherBad: "infeasible: similarity condition"}
	for _, l := range c.Limits {
		n.feasible = append(n.feasible, l.Name)
		n.infeasible = append(n.infeasible, "infeasible: "+l.Name)
	}
	return n
}

// of names the limit j (sweep.LimitingNone: none) that gives a margin.
func (n limitNames) of(j int, infeasible bool) string {
	switch {
	case j >= 0 && j < len(n.feasible):
		if infeasible {
			return n.infeasible[j]
		}
		return n.feasible[j]
	case j == sweep.LimitingNone:
		if infeasible {
			return "infeasible: "
		}
		return ""
	case infeasible:
		return n.otherBad
	}
	return n.other
}
