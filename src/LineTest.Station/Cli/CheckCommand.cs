using System.CommandLine;
using LineTest.Station.Composition;

namespace LineTest.Station.Cli;

/// <summary><c>linetest check SEQUENCE [--fixture FIXTURE]</c>: every problem of a sequence, with its location.</summary>
public static class CheckCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var sequence = new Argument<string>("SEQUENCE") { Description = "Sequence file to check" };
        var fixture = new Option<string?>("--fixture") { Description = "Also check against this fixture (safe range, wiring)" };
        var command = new Command("check", "Check a sequence file (and optionally against a fixture); exit 0 when clean, 2 when not")
        {
            sequence, fixture,
        };
        command.SetAction(parse =>
        {
            Core.Fixtures.FixtureDefinition? fx = null;
            if (parse.GetValue(fixture) is { } fixturePath)
            {
                var fixtureResult = DefinitionFiles.LoadFixture(fixturePath, context.Error);
                if (!fixtureResult.IsSuccess)
                {
                    return ExitCodes.BadInput;
                }

                fx = fixtureResult.Value;
            }

            var path = parse.GetValue(sequence)!;
            var result = DefinitionFiles.LoadSequence(path, fx, context.Error);
            if (!result.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var against = fx is null ? string.Empty : $" against fixture '{fx.Id}'";
            context.Output.WriteLine($"{path}: no problems{against} — {result.Value.Id} revision {result.Value.Revision}, {result.Value.Steps.Count} steps, sha256 {result.Sha256}");
            return ExitCodes.Done;
        });
        return command;
    }
}
