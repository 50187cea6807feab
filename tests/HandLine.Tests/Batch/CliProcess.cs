using System.Diagnostics;

namespace HandLine.Tests.Batch;

/// <summary>The <c>handline</c> executable run as a child process, as a user or a scheduler runs it.</summary>
internal sealed class CliProcess : IDisposable
{
    private readonly Process _process;
    private readonly Task<string> _stdout, _stderr;

    public CliProcess(string[] args)
    {
        var psi = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true };
        psi.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "handline.dll"));
        foreach (var a in args) psi.ArgumentList.Add(a);
        _process = Process.Start(psi)!;
        _stdout = _process.StandardOutput.ReadToEndAsync();
        _stderr = _process.StandardError.ReadToEndAsync();
    }

    public int Id => _process.Id;

    public bool HasExited => _process.HasExited;

    public (int Code, string Out, string Err) WaitForExit(int timeoutMs = 120_000)
    {
        if (!_process.WaitForExit(timeoutMs))
        {
            _process.Kill(entireProcessTree: true);
            throw new TimeoutException("handline did not finish");
        }
        return (_process.ExitCode, _stdout.Result, _stderr.Result);
    }

    /// <summary>Sends a POSIX signal by number (2 = SIGINT, 9 = SIGKILL), as a terminal or scheduler would.</summary>
    public void Signal(int signal)
    {
        using var kill = Process.Start("kill", [$"-{signal}", _process.Id.ToString(System.Globalization.CultureInfo.InvariantCulture)])!;
        kill.WaitForExit();
    }

    public void Dispose()
    {
        if (!_process.HasExited) _process.Kill(entireProcessTree: true);
        _process.Dispose();
    }
}
