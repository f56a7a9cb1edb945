package book

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"github.com/klauspost/compress/flate"
	"hash/crc32"
	"io"
	"os"
	"path"
	"strconv"
	"strings"
	"time"
)

// sheetParts maps each sheet's name to its worksheet part, from
// xl/workbook.xml and its relationships.
func sheetParts(zr *zip.Reader) (map[string]string, error) {
	var wbx struct {
		Sheets []struct {
			Name string `xml:"name,attr"`
			RID  string `xml:"http://schemas.openxmlformats.org/officeDocument/2006/relationships id,attr"`
		} `xml:"sheets>sheet"`
	}
	var rels struct {
		Rel []struct {
			ID     string `xml:"Id,attr"`
			Target string `xml:"Target,attr"`
		} `xml:"Relationship"`
	}
	if err := readXMLPart(zr, "xl/workbook.xml", &wbx); err != nil {
		return nil, err
	}
	if err := readXMLPart(zr, "xl/_rels/workbook.xml.rels", &rels); err != nil {
		return nil, err
	}
	target := map[string]string{}
	for _, r := range rels.Rel {
		t := r.Target
		if strings.HasPrefix(t, "/") {
			t = strings.TrimPrefix(t, "/")
		} else {
			t = path.Join("xl", t)
		}
		target[r.ID] = t
	}
	out := map[string]string{}
	for _, s := range wbx.Sheets {
		if t, ok := target[s.RID]; ok {
			out[s.Name] = t
		}
	}
	return out, nil
}

func readXMLPart(zr *zip.Reader, name string, v any) error {
	f, err := zr.Open(name)
	if err != nil {
		return fmt.Errorf("part %s: %w", name, err)
	}
	defer f.Close()
	if err := xml.NewDecoder(f).Decode(v); err != nil {
		return fmt.Errorf("part %s: %w", name, err)
	}
	return nil
}

// spliceRows writes the worksheet part f with rs's rows before </sheetData>:
// the part's head and tail are compressed apart and the rows' compressed
// stream goes between them as it is (deflate blocks concatenate; the head
// and the rows end on a sync flush), with the CRC of the whole combined.
func spliceRows(zw *zip.Writer, f *zip.File, stamp time.Time, rs *Rows) error {
	in, err := f.Open()
	if err != nil {
		return err
	}
	part, err := io.ReadAll(in)
	_ = in.Close()
	if err != nil {
		return err
	}
	at := bytes.LastIndex(part, []byte("</sheetData>"))
	if at < 0 {
		return errors.New("no </sheetData> to put the rows before")
	}
	head, tail := widenDimension(part[:at], rs), part[at:]
	var zhead, ztail bytes.Buffer
	if err := deflateTo(&zhead, head, false); err != nil {
		return err
	}
	if err := deflateTo(&ztail, tail, true); err != nil {
		return err
	}
	crc := crc32.ChecksumIEEE(head)
	crc = crc32Combine(crc, rs.CRC, rs.Size)
	crc = crc32Combine(crc, crc32.ChecksumIEEE(tail), int64(len(tail)))
	hdr := &zip.FileHeader{
		Name: f.Name, Method: zip.Deflate, Modified: stamp,
		CRC32:              crc,
		UncompressedSize64: uint64(int64(len(head)) + rs.Size + int64(len(tail))),
		CompressedSize64:   uint64(int64(zhead.Len()) + rs.Compress + int64(ztail.Len())),
	}
	hdr.ModifiedTime, hdr.ModifiedDate = 0, 1<<5|1 // as the copied parts
	out, err := zw.CreateRaw(hdr)
	if err != nil {
		return err
	}
	if _, err := out.Write(zhead.Bytes()); err != nil {
		return err
	}
	rf, err := os.Open(rs.Path)
	if err != nil {
		return err
	}
	defer rf.Close()
	if n, err := io.Copy(out, rf); err != nil || n != rs.Compress {
		if err == nil {
			err = fmt.Errorf("rows: %d compressed bytes, %d expected", n, rs.Compress)
		}
		return err
	}
	_, err = out.Write(ztail.Bytes())
	return err
}

// deflateTo compresses b to w; final ends the stream, else it ends on a sync flush.
func deflateTo(w io.Writer, b []byte, final bool) error {
	zw, err := flate.NewWriter(w, flate.BestSpeed)
	if err != nil {
		return err
	}
	if _, err := zw.Write(b); err != nil {
		return err
	}
	if final {
		return zw.Close()
	}
	return zw.Flush()
}

// widenDimension sets the last row of the head's <dimension ref="A1:X1"/> to
// the rows' last row (and column when wider).
func widenDimension(head []byte, rs *Rows) []byte {
	const open = `<dimension ref="`
	i := bytes.Index(head, []byte(open))
	if i < 0 || rs.LastRow == 0 {
		return head
	}
	j := bytes.IndexByte(head[i+len(open):], '"')
	if j < 0 {
		return head
	}
	ref := string(head[i+len(open) : i+len(open)+j])
	first, last, ok := strings.Cut(ref, ":")
	if !ok {
		first, last = ref, ref
	}
	k := strings.IndexAny(last, "0123456789")
	if k < 0 {
		return head
	}
	col, row := last[:k], last[k:]
	n, err := strconv.Atoi(row)
	if err != nil {
		return head
	}
	if rs.LastRow > n {
		n = rs.LastRow
	}
	if c := string(appendColName(nil, rs.LastCol)); rs.LastCol > 0 && (len(c) > len(col) || len(c) == len(col) && c > col) {
		col = c
	}
	out := append([]byte(nil), head[:i+len(open)]...)
	out = append(out, first+":"+col+strconv.Itoa(n)...)
	return append(out, head[i+len(open)+j:]...)
}

// crc32Combine returns the CRC-32 (IEEE) of A followed by B from crc1 of A,
// crc2 of B and B's length, by the GF(2) matrix method of zlib's crc32_combine.
func crc32Combine(crc1, crc2 uint32, len2 int64) uint32 {
	if len2 <= 0 {
		return crc1
	}
	var even, odd [32]uint32
	odd[0] = crc32.IEEE // the reflected polynomial 0xedb88320
	row := uint32(1)
	for n := 1; n < 32; n++ {
		odd[n] = row
		row <<= 1
	}
	gf2Square(&even, &odd) // two zero bits
	gf2Square(&odd, &even) // four zero bits
	for {
		gf2Square(&even, &odd) // apply len2 zero bytes to crc1
		if len2&1 != 0 {
			crc1 = gf2Times(&even, crc1)
		}
		len2 >>= 1
		if len2 == 0 {
			break
		}
		gf2Square(&odd, &even)
		if len2&1 != 0 {
			crc1 = gf2Times(&odd, crc1)
		}
		len2 >>= 1
		if len2 == 0 {
			break
		}
	}
	return crc1 ^ crc2
}

func gf2Times(mat *[32]uint32, vec uint32) uint32 {
	var sum uint32
	for i := 0; vec != 0; i, vec = i+1, vec>>1 {
		if vec&1 != 0 {
			sum ^= mat[i]
		}
	}
	return sum
}

func gf2Square(square, mat *[32]uint32) {
	for n := 0; n < 32; n++ {
		square[n] = gf2Times(mat, mat[n])
	}
}
