using System.CommandLine;
using BatchReconcile.Storage;

namespace BatchReconcile.Cli;

/// <summary>
/// The command tree of <c>batchreconcile</c> and the single place where failures become exit codes:
/// bad input or usage exits 2 with one line on stderr, anything unexpected exits 1.
/// </summary>
public static class CommandLine
{
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr)
    {
        var globals = new GlobalOptions();
        var root = new RootCommand("BatchReconcile: reconciles batch records step by step against the balanced equation.");
        globals.AddTo(root);
        root.Subcommands.Add(ChemCommands.Create(stdout));
        root.Subcommands.Add(RunCommand.Create(globals));
        root.Subcommands.Add(IngestCommand.Create(globals, stdout, stderr));
        root.Subcommands.Add(CheckCommand.Create(globals, stdout, stderr));
        root.Subcommands.Add(BatchesCommand.Create(globals, stdout));
        root.Subcommands.Add(DigestCommand.Create(globals, stdout));
        root.Subcommands.Add(FlagsCommand.Create(globals, stdout));
        root.Subcommands.Add(AuditCommand.Create(globals, stdout, stderr));
        root.Subcommands.Add(StoreCommand.Create(globals, stdout, stderr));
        root.Subcommands.Add(ExportCommand.Create(globals, stdout));
        root.Subcommands.Add(TrendCommand.Create(globals, stdout));
        root.Subcommands.Add(LossesCommand.Create(globals, stdout));
        root.Subcommands.Add(CompareCommand.Create(globals, stdout));
        root.Subcommands.Add(ReportCommand.Create(globals, stdout));
        root.Subcommands.Add(DemoCommand.Create(globals, stdout));

        var parsed = root.Parse(args);
        if (parsed.Errors.Count > 0)
        {
            stderr.WriteLine($"batchreconcile: {string.Join("; ", parsed.Errors.Select(e => e.Message))} (see 'batchreconcile --help')");
            return ExitCodes.BadInput;
        }

        try
        {
            return parsed.Invoke(new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false });
        }
        catch (UsageException e)
        {
            stderr.WriteLine($"batchreconcile: {e.Message}");
            return ExitCodes.BadInput;
        }
        catch (StoreException e)
        {
            // The database failed while the command ran (locked, full, read-only): one line that says what to do.
            // What the command had not committed was not stored; files not yet stored stay where they are.
            stderr.WriteLine($"batchreconcile: database: {e.Message}; nothing more was stored, try again once that is fixed");
            return ExitCodes.UnexpectedFailure;
        }
        catch (Exception e)
        {
            stderr.WriteLine($"batchreconcile: unexpected failure: {e}");
            return ExitCodes.UnexpectedFailure;
        }
    }
}
