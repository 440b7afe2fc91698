using System.Runtime.InteropServices;
using RankFreq.Primitives;

namespace RankFreq.Cli;

/// <summary>
/// SIGINT and SIGTERM stop a verb: the first cancels its work, which removes its temporaries and writes nothing under
/// a final name; the exit code is 130 for SIGINT and 143 for SIGTERM (128 + the signal, as shells report them).
/// </summary>
/// <remarks>
/// Work that does not stop within <see cref="Grace"/> (a read blocked on a pipe, a step that does not look at the
/// token) is not waited for: the temporaries the process holds are removed and it exits with the same code. A second
/// signal ends the process at once the same way.
/// </remarks>
internal static class Signals
{
    /// <summary>How long cancelled work may take to unwind before the process exits without it.</summary>
    public static readonly TimeSpan Grace = TimeSpan.FromMilliseconds(600);

    /// <summary>Exit code for SIGTERM (128 + 15).</summary>
    public const int Terminated = 143;

    /// <summary>Runs the command line with the process's SIGINT and SIGTERM turned into cancellation.</summary>
    public static async Task<int> RunAsync(string[] args, TextWriter stdout, TextWriter stderrRaw)
    {
        // the unwinding verb and a forced exit after the grace period can both reach the interruption line
        var stderr = new InterruptedOnce(stderrRaw);
        using var cts = new CancellationTokenSource();
        var signalled = new TaskCompletionSource<int>(TaskCreationOptions.RunContinuationsAsynchronously);
        int received = 0;
        void Handle(PosixSignalContext c)
        {
            c.Cancel = true; // the process ends when the work has unwound, not in the middle of a rename
            int code = c.Signal == PosixSignal.SIGTERM ? Terminated : CliApp.Interrupted;
            // from here on the run's own failures are the interruption's doing (a temporary folder removed under a
            // writer still going): only the interruption line is printed
            stderr.Stopping = true;
            if (Interlocked.Increment(ref received) > 1) Exit(stderr, code); // a second signal: no more waiting
            signalled.TrySetResult(code);
            cts.Cancel();
        }
        using var sigInt = PosixSignalRegistration.Create(PosixSignal.SIGINT, Handle);
        using var sigTerm = PosixSignalRegistration.Create(PosixSignal.SIGTERM, Handle);

        var run = CliApp.RunAsync(args, stdout, stderr, cts.Token);
        await Task.WhenAny(run, signalled.Task);
        // the signal is recorded before the work is cancelled, so a run that ended by cancellation always finds it
        // here, even when WhenAny saw the run's completion first
        if (!signalled.Task.IsCompleted) return await run;
        int signalCode = await signalled.Task;
        if (await Task.WhenAny(run, Task.Delay(Grace)) != run) Exit(stderr, signalCode);
        int code = await run;
        // the verb reports cancellation as 130, and any other failure after the signal is the signal's: the run
        // left nothing under a final name either way; SIGTERM has its own code. A run that finished is whole.
        if (code == CliApp.Ok) return code;
        stderr.WriteLine(CliApp.InterruptedLine);
        return signalCode;
    }

    /// <summary>Ends the process now: removes the temporaries it holds, says so, exits with <paramref name="code"/>.</summary>
    private static void Exit(TextWriter stderr, int code)
    {
        TempNames.RemoveHeld();
        try { stderr.WriteLine(CliApp.InterruptedLine); stderr.Flush(); }
        catch (IOException) { }
        Environment.Exit(code);
    }

    /// <summary>Passes lines through, except a repeat of <see cref="CliApp.InterruptedLine"/>, and once a signal has
    /// come, any line but that one.</summary>
    private sealed class InterruptedOnce(TextWriter inner) : TextWriter
    {
        private int said;

        /// <summary>Set when a signal has come: other lines are dropped.</summary>
        public volatile bool Stopping;
        public override System.Text.Encoding Encoding => inner.Encoding;
        public override void Write(char value) => inner.Write(value);
        public override void Write(string? value) => inner.Write(value);
        public override void Write(char[] buffer, int index, int count) => inner.Write(buffer, index, count);
        public override void WriteLine(string? value)
        {
            if (value == CliApp.InterruptedLine ? Interlocked.Exchange(ref said, 1) != 0 : Stopping) return;
            inner.WriteLine(value);
        }
        public override void Flush() => inner.Flush();
    }
}
