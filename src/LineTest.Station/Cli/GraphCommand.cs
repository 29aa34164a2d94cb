using System.CommandLine;
using LineTest.Core.Units;

namespace LineTest.Station.Cli;

/// <summary><c>linetest graph</c>: the unit state machine as DOT or Mermaid.</summary>
public static class GraphCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var format = new Option<string>("--format") { Description = "dot or mermaid", DefaultValueFactory = _ => "dot" };
        format.AcceptOnlyFromAmong("dot", "mermaid");
        var command = new Command("graph", "Print the unit state machine (Graphviz DOT or Mermaid)") { format };
        command.SetAction(parse =>
        {
            context.Output.WriteLine(parse.GetValue(format) == "mermaid" ? UnitStateMachine.ToMermaidGraph() : UnitStateMachine.ToDotGraph());
            return ExitCodes.Done;
        });
        return command;
    }
}
