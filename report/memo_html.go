package report

import (
	"bytes"
	"encoding/base64"
	"fmt"
	"html"
	"os"
	"path/filepath"
	"regexp"
	"strings"
)

// memoCSS is the memo's own style: a readable column, ruled tables that
// a word processor keeps when the page is pasted, figures at full width.
const memoCSS = `body{font-family:"Liberation Sans",Arial,Helvetica,sans-serif;font-size:11pt;line-height:1.45;color:#1a1a1a;max-width:48em;margin:2em auto;padding:0 1em}
h1{font-size:18pt;margin:0 0 .4em}h2{font-size:13pt;margin:1.6em 0 .5em;border-bottom:1px solid #ccc;padding-bottom:.15em}
table{border-collapse:collapse;margin:.6em 0 1em;font-size:10pt}th,td{border:1px solid #b8b8b8;padding:.25em .55em;text-align:left;vertical-align:top}
th{background:#eef2f6}td.num{text-align:right;white-space:nowrap}
figure{margin:1.2em 0}figure img{max-width:100%;height:auto;border:1px solid #ddd}figcaption,p.caption{font-size:9.5pt;color:#444}
ul{padding-left:1.3em}li{margin:.2em 0}p.note{color:#444}`

var (
	imageLineRE = regexp.MustCompile(`^!\[([^\]]*)\]\(([^)]+)\)$`)
	boldRE      = regexp.MustCompile(`\*\*([^*]+)\*\*`)
	italicRE    = regexp.MustCompile(`\*([^*]+)\*`)
	numberRE    = regexp.MustCompile(`^[−-]?[0-9][0-9,.]*( ?[×⁰¹²³⁴⁵⁶⁷⁸⁹⁻ 0-9]*)?( (million|billion))?( [A-Z]{3})?$`)
)

// inline turns the memo's inline Markdown (bold, italic, escaped pipes)
// into HTML, escaping everything else.
func inline(s string) string {
	s = html.EscapeString(strings.ReplaceAll(s, `\|`, "|"))
	s = boldRE.ReplaceAllString(s, "<strong>$1</strong>")
	return italicRE.ReplaceAllString(s, "<em>$1</em>")
}

// tableCells splits a Markdown table row into its cells ("\|" is a pipe
// inside a cell).
func tableCells(line string) []string {
	line = strings.TrimSpace(line)
	line = strings.TrimSuffix(strings.TrimPrefix(line, "|"), "|")
	var cells []string
	var cur strings.Builder
	for i := 0; i < len(line); i++ {
		switch {
		case line[i] == '\\' && i+1 < len(line) && line[i+1] == '|':
			cur.WriteString(`\|`)
			i++
		case line[i] == '|':
			cells = append(cells, strings.TrimSpace(cur.String()))
			cur.Reset()
		default:
			cur.WriteByte(line[i])
		}
	}
	return append(cells, strings.TrimSpace(cur.String()))
}

// MemoHTML renders the memo's Markdown as one self-contained HTML page:
// real tables, the figures embedded as data URIs (read from dir), our own
// inline style. It understands the Markdown the memo writes: headings,
// paragraphs, bold and italic, lists with continuation lines, tables and
// image lines.
func MemoHTML(title, memo, dir string) ([]byte, error) {
	var b bytes.Buffer
	fmt.Fprintf(&b, "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>%s</title>\n<style>\n%s\n</style>\n</head>\n<body>\n",
		html.EscapeString("Model test proposal: "+title), memoCSS)
	lines := strings.Split(strings.TrimRight(memo, "\n"), "\n")
	var para []string
	inList := false
	flush := func() {
		if len(para) > 0 {
			cls := ""
			if strings.HasPrefix(para[0], "*Figure ") {
				cls = ` class="caption"`
			}
			fmt.Fprintf(&b, "<p%s>%s</p>\n", cls, inline(strings.Join(para, " ")))
			para = nil
		}
		if inList {
			b.WriteString("</li>\n</ul>\n")
			inList = false
		}
	}
	for i := 0; i < len(lines); i++ {
		line := lines[i]
		switch {
		case strings.TrimSpace(line) == "":
			flush()
		case strings.HasPrefix(line, "# "):
			flush()
			fmt.Fprintf(&b, "<h1>%s</h1>\n", inline(line[2:]))
		case strings.HasPrefix(line, "## "):
			flush()
			fmt.Fprintf(&b, "<h2>%s</h2>\n", inline(line[3:]))
		case strings.HasPrefix(line, "- "):
			if len(para) > 0 {
				fmt.Fprintf(&b, "<p>%s</p>\n", inline(strings.Join(para, " ")))
				para = nil
			}
			if inList {
				b.WriteString("</li>\n")
			} else {
				b.WriteString("<ul>\n")
				inList = true
			}
			fmt.Fprintf(&b, "<li>%s", inline(line[2:]))
		case inList && strings.HasPrefix(line, "  "):
			fmt.Fprintf(&b, "<br>%s", inline(strings.TrimSpace(line)))
		case strings.HasPrefix(line, "|"):
			flush()
			var rows [][]string
			for ; i < len(lines) && strings.HasPrefix(lines[i], "|"); i++ {
				rows = append(rows, tableCells(lines[i]))
			}
			i--
			writeTable(&b, rows)
		case imageLineRE.MatchString(line):
			flush()
			m := imageLineRE.FindStringSubmatch(line)
			src, err := dataURI(filepath.Join(dir, m[2]))
			if err != nil {
				return nil, err
			}
			fmt.Fprintf(&b, "<figure><img src=\"%s\" alt=\"%s\"></figure>\n", src, html.EscapeString(m[1]))
		default:
			if inList {
				flush()
			}
			para = append(para, line)
		}
	}
	flush()
	b.WriteString("</body>\n</html>\n")
	return b.Bytes(), nil
}

// writeTable writes a Markdown table (header, rule, rows) as an HTML
// table; cells that hold a number or an amount are right-aligned.
func writeTable(b *bytes.Buffer, rows [][]string) {
	b.WriteString("<table>\n")
	for r, cells := range rows {
		if r == 1 && len(cells) > 0 && strings.HasPrefix(cells[0], "---") {
			continue
		}
		b.WriteString("<tr>")
		for _, c := range cells {
			switch {
			case r == 0:
				fmt.Fprintf(b, "<th>%s</th>", inline(c))
			case numberRE.MatchString(c):
				fmt.Fprintf(b, "<td class=\"num\">%s</td>", inline(c))
			default:
				fmt.Fprintf(b, "<td>%s</td>", inline(c))
			}
		}
		b.WriteString("</tr>\n")
	}
	b.WriteString("</table>\n")
}

// dataURI reads an image into a data URI.
func dataURI(path string) (string, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return "", fmt.Errorf("memo figure: %v", err)
	}
	mime := "image/png"
	switch strings.ToLower(filepath.Ext(path)) {
	case ".svg":
		mime = "image/svg+xml"
	case ".pdf":
		return "", fmt.Errorf("memo figure %s: a PDF cannot be embedded in HTML", path)
	}
	return "data:" + mime + ";base64," + base64.StdEncoding.EncodeToString(data), nil
}
