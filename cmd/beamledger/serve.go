package main

import (
	"context"
	"errors"
	"fmt"
	"net"
	"net/http"
	"time"

	"github.com/spf13/cobra"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/page"
	"beamledger/safety/report"
)

type serveOptions struct {
	file, addr string
	poll       time.Duration
	tol        toleranceFlags
}

func (e *env) newServe() *cobra.Command {
	o := &serveOptions{}
	cmd := &cobra.Command{
		Use:   "serve FILE [--addr 127.0.0.1:8765]",
		Short: "Show a setup's sign-off document in the browser, updated as the file is edited",
		Long: `serve evaluates a setup as report does and serves its document as one page
on a local address; it reads the file again every --poll and, when the
file's bytes change, evaluates it anew and updates the open pages without a
reload (server-sent events). While the file does not load, the page shows the
error with its file, line and key, and keeps the last result that loaded,
greyed. Nothing is written to disk. Ctrl-C (or SIGTERM) stops it.

It listens on the loopback address 127.0.0.1:8765 unless --addr gives
another; an address other machines can reach is served only when given
explicitly, with a warning: the page shows the whole setup file.

Exit status: 0 when stopped by a signal, 2 when the address cannot be used.`,
		Example: `  beamledger serve testdata/examples/table-c.toml
  beamledger serve mylab.toml --addr 127.0.0.1:9000`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.file = args[0]
			return e.runServe(cmd.Context(), o)
		},
	}
	cmd.Flags().StringVar(&o.addr, "addr", "127.0.0.1:8765", "the address to listen on (host:port)")
	cmd.Flags().DurationVar(&o.poll, "poll", 500*time.Millisecond, "how often the file is read for changes")
	o.tol.add(cmd)
	return cmd
}

func (e *env) runServe(ctx context.Context, o *serveOptions) error {
	if o.poll < 10*time.Millisecond {
		return fmt.Errorf("--poll %s: at least 10ms", o.poll)
	}
	host, _, err := net.SplitHostPort(o.addr)
	if err != nil {
		return fmt.Errorf("--addr %q: %w", o.addr, err)
	}
	if ip := net.ParseIP(host); host != "localhost" && (ip == nil || !ip.IsLoopback()) {
		fmt.Fprintf(e.stderr, "beamledger: warning: --addr %s can be reached from other machines; the page shows the whole setup file\n", o.addr)
	}
	opts, err := o.tol.options()
	if err != nil {
		return err
	}
	live := &page.Live{
		Read: func() ([]byte, error) { return setup.ReadSetupFile(o.file) },
		Build: func(data []byte) (*report.Document, error) {
			s, err := setup.Parse(o.file, data)
			if err != nil {
				return nil, err
			}
			a, err := safety.EvaluateWith(s, opts)
			if err != nil {
				return nil, err
			}
			return report.Build(a, report.Meta{Date: e.now().UTC().Format("2006-01-02"), ToolVersion: version, SetupBytes: data}), nil
		},
		Poll: o.poll,
	}
	live.Refresh()
	ln, err := net.Listen("tcp", o.addr)
	if err != nil {
		return err
	}
	sig, stop := e.interrupts()
	defer stop()
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	// Requests live in ctx: cancelling it ends the open event streams.
	srv := &http.Server{Handler: live.Handler(), ReadHeaderTimeout: 10 * time.Second, BaseContext: func(net.Listener) context.Context { return ctx }}
	go live.Run(ctx)
	fmt.Fprintf(e.stdout, "serving %s at http://%s/ (the page updates as the file changes; Ctrl-C stops)\n", o.file, ln.Addr())
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ln) }()
	select {
	case <-sig:
	case <-ctx.Done():
	case err := <-done:
		return err
	}
	shutdown, cancelShutdown := context.WithTimeout(context.Background(), 2*time.Second)
	defer cancelShutdown()
	// Open event streams end with the server's context.
	cancel()
	if err := srv.Shutdown(shutdown); err != nil && !errors.Is(err, context.DeadlineExceeded) {
		return err
	}
	fmt.Fprintln(e.stdout, "stopped")
	return nil
}
