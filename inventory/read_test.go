package inventory

import (
	"archive/zip"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// Files that are no .xlsx each give one sentence wrapping ErrUnreadable.
func TestReadUnreadable(t *testing.T) {
	dir := t.TempDir()
	good, err := os.ReadFile(utWriteBook(t, utValidBook()))
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 1))
	random := make([]byte, 4096)
	for i := range random {
		random[i] = byte(rng.UintN(256))
	}
	random[0], random[1] = 0x00, 0x01 // not a zip or OLE signature
	var zipNoWorkbook bytes.Buffer
	zw := zip.NewWriter(&zipNoWorkbook)
	w, _ := zw.Create("hello.txt")
	w.Write([]byte("hello"))
	zw.Close()
	cases := []struct {
		name string
		data []byte
		opts ReadOptions
		want string // part of the sentence
	}{
		{"empty", nil, ReadOptions{}, "it is empty"},
		{"csv renamed", []byte("ID,Station,Kind\nW-1,ST-1,sheet\n"), ReadOptions{}, "text or CSV"},
		{"random bytes", random, ReadOptions{}, "not an .xlsx"},
		{"truncated zip", good[:len(good)/2], ReadOptions{}, "damaged or truncated"},
		{"OLE (encrypted or .xls)", append([]byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}, make([]byte, 600)...), ReadOptions{}, "password-protected"},
		{"zip without workbook", zipNoWorkbook.Bytes(), ReadOptions{}, "cannot be read"},
		{"over the size cap", good, ReadOptions{MaxFileSize: 1024}, "larger than"},
		{"unzip limit", good, ReadOptions{UnzipSizeLimit: 2048, UnzipXMLSizeLimit: 1024}, "unpack"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p := filepath.Join(dir, strings.ReplaceAll(tc.name, " ", "_")+".xlsx")
			if err := os.WriteFile(p, tc.data, 0o600); err != nil {
				t.Fatal(err)
			}
			s, err := ReadFile(p, tc.opts)
			if err == nil {
				t.Fatalf("ReadFile accepted %s (%d problems)", tc.name, len(s.Problems))
			}
			if !errors.Is(err, ErrUnreadable) {
				t.Fatalf("error %v does not wrap ErrUnreadable", err)
			}
			msg := err.Error()
			if !strings.Contains(msg, tc.want) {
				t.Errorf("message %q does not say %q", msg, tc.want)
			}
			if strings.Count(msg, ". ") > 0 || !strings.HasSuffix(msg, ".") || strings.Contains(msg, "\n") {
				t.Errorf("message is not one sentence: %q", msg)
			}
			// Read (from memory) agrees.
			if _, err := Read(tc.data, "x.xlsx", tc.opts); !errors.Is(err, ErrUnreadable) {
				t.Errorf("Read: error %v does not wrap ErrUnreadable", err)
			}
		})
	}
	t.Run("password-protected", func(t *testing.T) {
		f := excelize.NewFile()
		f.SetCellValue("Sheet1", "A1", "secret")
		p := filepath.Join(dir, "locked.xlsx")
		if err := f.SaveAs(p, excelize.Options{Password: "pw"}); err != nil {
			t.Skip("excelize cannot encrypt here:", err)
		}
		_, err := ReadFile(p, ReadOptions{})
		if !errors.Is(err, ErrUnreadable) || !strings.Contains(err.Error(), "password-protected") {
			t.Errorf("error %v", err)
		}
	})
	t.Run("missing file", func(t *testing.T) {
		if _, err := ReadFile(filepath.Join(dir, "nope.xlsx"), ReadOptions{}); !errors.Is(err, ErrUnreadable) || !errors.Is(err, os.ErrNotExist) {
			t.Errorf("error %v", err)
		}
	})
	t.Run("folder", func(t *testing.T) {
		if _, err := ReadFile(dir, ReadOptions{}); !errors.Is(err, ErrUnreadable) {
			t.Errorf("error %v", err)
		}
	})
}

// The digest is of the file's bytes, and the private temporary folder is removed.
func TestReadSHA256AndTempCleanup(t *testing.T) {
	p := utWriteBook(t, utValidBook())
	data, _ := os.ReadFile(p)
	tmp := t.TempDir()
	s, err := ReadFile(p, ReadOptions{TmpDir: tmp})
	if err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256(data)
	if s.SHA256 != hex.EncodeToString(sum[:]) || s.Path != p {
		t.Errorf("SHA256 %s path %s", s.SHA256, s.Path)
	}
	left, _ := os.ReadDir(tmp)
	if len(left) != 0 {
		t.Errorf("temporary files left behind: %v", left)
	}
	after, _ := os.ReadFile(p)
	if !bytes.Equal(data, after) {
		t.Error("the survey was modified")
	}
}

// The reader reads what the template helper's demo writer produces, with
// every row accounted for.
func TestReadDemo(t *testing.T) {
	data, err := DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	s, err := Read(data, "demo.xlsx", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	utAccounted(t, s)
	if n := len(s.Errors()); n != 0 {
		t.Errorf("demo survey has %d errors:\n%s", n, utDump(s))
	}
	if len(s.Objects) < 30 {
		t.Errorf("only %d objects accepted", len(s.Objects))
	}
}

// FuzzRead mutates a valid survey's bytes: the reader never panics, returns
// either ErrUnreadable or a survey whose rows are all accounted for.
func FuzzRead(f *testing.F) {
	p := utWriteBook(f, utValidBook())
	data, err := os.ReadFile(p)
	if err != nil {
		f.Fatal(err)
	}
	f.Add(data, uint16(0), byte(0))
	f.Add(data, uint16(100), byte(0xff))
	f.Add([]byte("PK\x03\x04"), uint16(0), byte(0))
	f.Fuzz(func(t *testing.T, b []byte, at uint16, v byte) {
		if len(b) > 0 {
			b = append([]byte(nil), b...)
			b[int(at)%len(b)] ^= v
		}
		s, err := Read(b, "fuzz.xlsx", ReadOptions{MaxRows: 1000})
		if err != nil {
			if !errors.Is(err, ErrUnreadable) {
				t.Fatalf("error %v does not wrap ErrUnreadable", err)
			}
			return
		}
		utAccounted(t, s)
	})
}
