using System.CommandLine;
using LineTest.Core.Definitions;
using LineTest.Station.Composition;

namespace LineTest.Station.Cli;

/// <summary><c>linetest schema</c>: the JSON Schema of sequence (default) or fixture files.</summary>
public static class SchemaCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var output = new Option<string?>("--out") { Description = "Write the schema to this file instead of standard output" };
        var kind = new Option<string>("--kind") { Description = "sequence or fixture", DefaultValueFactory = _ => "sequence" };
        kind.AcceptOnlyFromAmong("sequence", "fixture");
        var command = new Command("schema", "Print the JSON Schema of sequence files (or fixture files with --kind fixture)") { output, kind };
        command.SetAction(parse =>
        {
            var docs = ModelDocs.ForCoreModel();
            var text = parse.GetValue(kind) == "fixture" ? DefinitionSchemas.Fixture(docs.Describe) : DefinitionSchemas.Sequence(docs.Describe);
            if (parse.GetValue(output) is { } path)
            {
                try
                {
                    File.WriteAllText(path, text);
                }
                catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
                {
                    context.Error.WriteLine($"linetest: cannot write {path}: {ex.Message}");
                    return ExitCodes.RuntimeFailure;
                }

                context.Output.WriteLine($"Schema written to {path}");
            }
            else
            {
                context.Output.Write(text);
            }

            return ExitCodes.Done;
        });
        return command;
    }
}
