using System.CommandLine;
using Microsoft.Extensions.Hosting;

namespace BatchReconcile.Cli;

/// <summary><c>run</c>: the service. Watches the inbox until SIGTERM or Ctrl-C.</summary>
public static class RunCommand
{
    public static Command Create(GlobalOptions globals)
    {
        var command = new Command("run", "Run the service: watch the inbox and reconcile every file that arrives, until stopped");
        command.SetAction(parse => HostedCommand.Run(parse, globals, service: true, host =>
        {
            host.Run();
            return ExitCodes.Success;
        }));
        return command;
    }
}
