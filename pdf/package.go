package pdf

import (
	"bytes"
	"context"
	"fmt"
	"io"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
)

func init() {
	// pdfcpu would otherwise write a configuration file into the user's
	// home; sheaf needs none.
	api.DisableConfigDir()
}

// Part is one page of a built package to print, with the bookmark that
// leads to it.
type Part struct {
	Address  string // file:// address of the page
	Bookmark string // "" takes the page's title
}

// Package prints parts one by one, in order, and joins them into one PDF
// with a bookmark at the first page of each part. Each part is printed on
// its own, so that "page x of y" counts the pages of that sheet. It
// returns the PDF and its number of pages.
func Package(ctx context.Context, b *Browser, parts []Part, l Layout) ([]byte, int, error) {
	tab, cancel := b.Tab()
	defer cancel()
	var (
		docs  []io.ReadSeeker
		marks []pdfcpu.Bookmark
		page  = 1
	)
	conf := model.NewDefaultConfiguration()
	for _, part := range parts {
		if err := ctx.Err(); err != nil {
			return nil, 0, err
		}
		data, title, err := Print(tab, part.Address, l)
		if err != nil {
			return nil, 0, err
		}
		n, err := api.PageCount(bytes.NewReader(data), conf)
		if err != nil {
			return nil, 0, fmt.Errorf("reading the PDF of %s: %w", part.Address, err)
		}
		label := part.Bookmark
		if label == "" {
			label = title
		}
		marks = append(marks, pdfcpu.Bookmark{Title: label, PageFrom: page})
		page += n
		docs = append(docs, bytes.NewReader(data))
	}
	if len(docs) == 0 {
		return nil, 0, fmt.Errorf("nothing to print")
	}
	var joined bytes.Buffer
	if len(docs) == 1 {
		if _, err := io.Copy(&joined, docs[0]); err != nil {
			return nil, 0, err
		}
	} else if err := api.MergeRaw(docs, &joined, false, conf); err != nil {
		return nil, 0, fmt.Errorf("joining the pages: %w", err)
	}
	var out bytes.Buffer
	if err := api.AddBookmarks(bytes.NewReader(joined.Bytes()), &out, marks, true, conf); err != nil {
		return nil, 0, fmt.Errorf("adding bookmarks: %w", err)
	}
	return out.Bytes(), page - 1, nil
}
