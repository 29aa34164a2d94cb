using System.Text.RegularExpressions;
using LineTest.Core.Results;
using LineTest.Station.Tests.Cli;
using LineTest.Storage.History;
using LineTest.TestSupport;

namespace LineTest.Station.Tests.Hosting;

/// <summary>
/// The operator's whole shift in a real 80×24 terminal (tmux), one test per thing that was found broken: log lines on
/// the live screen, the scan after a batch dropped, input ignored, an end screen that did not fit, production without
/// badge and lot, history, slots out of service, Ctrl-C.
/// </summary>
public sealed partial class OperatorShiftEndToEndTests
{
    private const string Caution = "CAUTION|HOT:|COLD:";

    [TmuxFact]
    public async Task Run_DefaultLogSettings_NoLogLineOnTheLiveScreen()
    {
        // What broke: with the default appsettings.json, log lines went to the live screen's terminal, shifting every
        // redraw; the header ended up printed 7 times.
        using var station = StationTerminal.Start(speed: 4000);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("CTP40A-2612-000401");
        await station.TypeAsync("CTP40A-2612-000402");
        await station.TypeAsync(string.Empty);
        var screen = await station.WaitForAsync("Batch done");

        Assert.DoesNotMatch(@"\d\d:\d\d:\d\d (INF|WRN|ERR) ", screen);
        Assert.Equal(1, Count(screen, "LineTest station ST-01"));
        Assert.Equal(1, Count(screen, "│ Slot │"));
        var logs = Directory.GetFiles(Path.Combine(station.Work, "logs"));
        Assert.Contains(logs, f => File.ReadAllText(f).Contains("Run ended", StringComparison.Ordinal));
    }

    [TmuxFact]
    public async Task Run_FirstScanAfterBatchDone_IsLoadedNotDropped()
    {
        // What broke: the first keyboard scan after "Batch done" cleared the board and was lost without a word.
        using var station = StationTerminal.Start(speed: 4000, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("CTP40A-2612-000411");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Batch done");

        await station.TypeAsync("CTP40A-2612-000412");
        var screen = await station.WaitForAsync("or press Enter to start the batch of 1");

        Assert.Matches(@"│\s+1\s+│ CTP40A-2612-000412", screen);
        await station.TypeAsync("CTP40A-2612-00041");
        screen = await station.WaitForAsync("Refused: 'CTP40A-2612-00041'");
        Assert.Contains("expected like CTP40A-2612-000123", screen, StringComparison.Ordinal);
        Assert.DoesNotContain("[0-9]", screen, StringComparison.Ordinal);
    }

    [TmuxFact]
    public async Task Run_UnknownInputAndCancelOfUnknownOrEmptySlot_AnsweredAtOnce()
    {
        // What broke: during a batch a misspelt command was ignored, and 'cancel 9' and 'cancel 3' (empty) asked for
        // confirmation, then said "Cancelling." though nothing was cancelled.
        using var station = StationTerminal.Start(speed: 60, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("CTP40A-2612-000421");
        await station.TypeAsync("CTP40A-2612-000422");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Batch of 2 started");

        await station.TypeAsync("cnacel");
        await station.WaitForAsync("Not understood: 'cnacel'. While the batch runs: cancel, cancel N, history SERIAL.");
        await station.TypeAsync("cancel 9");
        await station.WaitForAsync("Refused: '9' is not a slot of this fixture");
        await station.TypeAsync("cancel 3");
        var screen = await station.WaitForAsync("Refused: slot 3 is empty in this batch; nothing to cancel.");

        Assert.DoesNotContain("Cancel slot 3?", screen, StringComparison.Ordinal);
        Assert.DoesNotContain("Cancelling", screen, StringComparison.Ordinal);
        Assert.Matches(@"> Batch of 2 started", screen);
    }

    [TmuxFact]
    public async Task Run_EndScreen_FitsWithCautionLineAndWhereEachUnitGoes()
    {
        // What broke: the end screen was too tall for 24 rows (the caution line scrolled off), never said where a
        // failed unit goes, and cut the fail reason at 80 columns.
        using var station = StationTerminal.Start(speed: 4000, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        foreach (var serial in new[] { "CTP40A-2612-000431", "CTP40A-2612-000432", "CTP40A-2612-000433", "CTP40A-2612-000434" })
        {
            await station.TypeAsync(serial);
        }

        var screen = await station.WaitForAsync("Batch done");
        await Task.Delay(500);
        screen = station.Screen();

        Assert.Matches(Caution, screen);
        Assert.Contains("LineTest station ST-01", screen, StringComparison.Ordinal);
        for (var slot = 1; slot <= 4; slot++)
        {
            Assert.Matches($@"slot {slot} (PASS → packing tray|FAIL → (red reject bin|yellow retest rack \(trim again\))|ERROR → yellow retest rack)", screen);
        }

        Assert.Contains("Put each unit where its slot line says", screen, StringComparison.Ordinal);
        Assert.DoesNotContain("…", screen, StringComparison.Ordinal);
    }

    [TmuxFact]
    public async Task Run_ProductionWithoutBadgeAndLot_RefusesThenStoresBothWithTheRun()
    {
        // What broke: production mode started with no operator and no lot, and the screen had no way to enter them.
        var work = Some.TempDirectory();
        var results = Path.Combine(work, "results");
        var (released, _, error) = await CliRunner.RunAsync("release", RepoFiles.Path("sequences/ctp40a-dac.json"), "--by", "qa-lead", "--results", results);
        Assert.True(released == 0, error);
        using var station = StationTerminal.Start(speed: 4000, new Dictionary<string, string> { ["Station__Mode"] = "production" }, results, quietLog: true);
        await station.WaitForAsync("Production: scan your operator badge.");

        await station.TypeAsync("CTP40A-2612-000441");
        await station.WaitForAsync("Refused: CTP40A-2612-000441 is a unit serial; production needs the operator's badge and the lot");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Refused: production needs the operator's badge and the lot before the first batch");
        await station.TypeAsync("badge-0412");
        await station.WaitForAsync("Scan the lot number.");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Refused: production needs the lot before the first batch");
        await station.TypeAsync("L-2612-07");
        var screen = await station.WaitForAsync("Scan the serial for slot 1");
        Assert.Contains("lot L-2612-07 · operator badge-0412", screen, StringComparison.Ordinal);
        await station.TypeAsync("CTP40A-2612-000441");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Batch done");

        var run = Assert.Single(await new SerialHistoryReader(results).ReadAsync("CTP40A-2612-000441", CancellationToken.None));
        Assert.Equal(("badge-0412", "L-2612-07"), (run.Operator, run.Lot));
    }

    [TmuxFact]
    public async Task Run_HistoryOnTheScreen_ListsTheUnitsRuns()
    {
        // What broke: nothing at the station showed a unit's history.
        using var station = StationTerminal.Start(speed: 4000, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("CTP40A-2612-000451");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Batch done");

        await station.TypeAsync("history CTP40A-2612-000451");
        var screen = await station.WaitForAsync("History of CTP40A-2612-000451: 1 run");

        Assert.Matches(@"\d{4}-\d\d-\d\d \d\d:\d\d  ST-01 slot 1  (PASS|FAIL|ERROR)", screen);
        Assert.Matches(Caution, screen);
    }

    [TmuxFact]
    public async Task Run_SlotOutOfService_SkippedShownAndRecorded()
    {
        // What broke: there was no way to take a bad well out of service.
        using var station = StationTerminal.Start(speed: 4000, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("slot 1 off insert worn");
        var screen = await station.WaitForAsync("Slot 1 is out of service: insert worn.");
        Assert.Matches(@"│\s+1\s+│ -\s+│ out of service\s+│.*OFF", screen);
        Assert.Contains("> Scan the serial for slot 2", screen, StringComparison.Ordinal);

        await station.TypeAsync("CTP40A-2612-000461");
        await station.TypeAsync(string.Empty);
        screen = await station.WaitForAsync("Batch done");

        Assert.Matches(@"│\s+2\s+│ CTP40A-2612-000461", screen);
        Assert.Contains("slot 1 out of service: insert worn", screen, StringComparison.Ordinal);
        Assert.Contains("\"slot\":1,\"inService\":false,\"reason\":\"insert worn\"", File.ReadAllText(Path.Combine(station.Results, "slot-service.jsonl")), StringComparison.Ordinal);
    }

    [TmuxFact]
    public async Task Run_CtrlCDuringBatch_AsksThenStopsWithExit130AndRunsStoredAsError()
    {
        // What broke: Ctrl-C mid-batch ended with 4 ERRORs, exit 0, and a last line that still said to scan the next unit.
        using var station = StationTerminal.Start(speed: 60, quietLog: true);
        await station.WaitForAsync("Scan the serial for slot 1");
        await station.TypeAsync("CTP40A-2612-000471");
        await station.TypeAsync("CTP40A-2612-000472");
        await station.TypeAsync(string.Empty);
        await station.WaitForAsync("Batch of 2 started");

        station.Key("C-c");
        await station.WaitForAsync("Stop the station?");
        await station.TypeAsync("no");
        await station.WaitForAsync("Not stopped; the batch carries on.");
        station.Key("C-c");
        await station.WaitForAsync("Stop the station?");
        await station.TypeAsync("yes");
        var screen = await station.WaitForAsync("EXIT=");

        Assert.Contains("EXIT=130", screen, StringComparison.Ordinal);
        Assert.DoesNotContain("then scan the next", screen, StringComparison.Ordinal);
        foreach (var serial in new[] { "CTP40A-2612-000471", "CTP40A-2612-000472" })
        {
            var run = Assert.Single(await new SerialHistoryReader(station.Results).ReadAsync(serial, CancellationToken.None));
            Assert.Equal(Verdict.Error, run.Verdict);
            Assert.StartsWith("cancelled", run.Reason, StringComparison.Ordinal);
        }
    }

    private static int Count(string text, string word) => Regex.Matches(text, Regex.Escape(word)).Count;
}
