package main

import (
	"context"
	"fmt"
	"io"
	"net/http"
	"os"
	"os/signal"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/preview"
	"github.com/sheaf-calc/sheaf/render"
)

func previewCmd(stdout, stderr io.Writer) *cobra.Command {
	var flags commonFlags
	var port int
	c := &cobra.Command{
		Use:   "preview <folder|file>",
		Short: "Serve the package on localhost and rebuild it on every save; open pages reload themselves",
		Long: "preview renders the package in memory and serves it at http://127.0.0.1:<port>/. On each save under the\n" +
			"sources it rebuilds and the open pages reload through server-sent events (the reload script is added\n" +
			"only to served pages; built pages stay free of scripts). Errors show in place; an edit that cannot be\n" +
			"loaded keeps the last good pages, with the reason across the top. Stop it with Ctrl-C.",
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opt, err := flags.options()
			if err != nil {
				return err
			}
			opt.JSON = ""
			srv, err := preview.New(args[0], opt)
			if err != nil {
				return err
			}
			ln, err := preview.Listen(port)
			if err != nil {
				return fmt.Errorf("--port %d: %w; give another port, or 0 for a free one", port, err)
			}
			ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
			defer stop()
			hs := &http.Server{Handler: srv}
			go func() {
				<-ctx.Done()
				hs.Close()
			}()
			go srv.Watch(ctx, func(err error) {
				if err != nil {
					fmt.Fprintf(stderr, "rebuild failed, still serving the last good pages: %v\n", err)
					return
				}
				fmt.Fprintln(stderr, "rebuilt")
			})
			fmt.Fprintf(stdout, "serving http://%s/ — %s\n", ln.Addr(), render.Caution)
			if err := hs.Serve(ln); err != http.ErrServerClosed {
				return err
			}
			return nil
		},
	}
	flags.register(c)
	c.Flags().IntVar(&port, "port", 8088, "port on 127.0.0.1 to serve at; 0 picks a free one")
	return c
}
