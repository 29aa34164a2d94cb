using LineTest.Reports.Loading;

namespace LineTest.Factory.Reporting.Packs;

/// <summary>Placing the months read from the packs into the report's run table and series.</summary>
internal static partial class PackedReportLoader
{
    /// <summary>Adds months of runs, in order, to the report's runs and series.</summary>
    /// <param name="data">Where the runs and series go.</param>
    /// <param name="query">Which readings are asked for, and whether operators are.</param>
    /// <param name="monthRuns">How many runs each month's packs hold, in the order the months are placed.</param>
    private sealed class Placer(ReportData data, ReportQuery query, long[] monthRuns)
    {
        private readonly bool _operators = query.GroupBy == ReportGrouping.Operator;
        private int _month;

        public void Place(MonthRuns month)
        {
            // The runs go into the run table and the readings into their series at once: a reading's run is numbered
            // by its place in the order (the runs before this month plus its position), which does not wait for the table.
            var first = data.Runs.Count;
            Parallel.Invoke(() => PlaceRuns(month), () => PlaceReadings(month, first));
            _month++;
        }

        private void PlaceRuns(MonthRuns month)
        {
            var runs = data.Runs;
            runs.EnsureCapacity(runs.Count + month.Order.Length);

            // Per pack: its texts as the table's numbers, and which sequences' products are known.
            var numbers = month.Packs.Select(p => p.Texts.Select(runs.TextNumber).ToArray()).ToArray();
            var productKnown = month.Packs.Select(p => new bool[p.Texts.Length]).ToArray();
            foreach (var key in month.Order)
            {
                var (p, r) = ((int)(key >> 32), (int)key);
                var pack = month.Packs[p];
                var number = numbers[p];
                if (!productKnown[p][pack.Sequence[r]])
                {
                    // The product of a sequence's first run, as the folder loader takes it.
                    var sequence = pack.Texts[pack.Sequence[r]];
                    if (!data.Products.ContainsKey(sequence))
                    {
                        data.AddProduct(sequence, pack.Texts[pack.Product[r]]);
                    }

                    productKnown[p][pack.Sequence[r]] = true;
                }

                var run = runs.AddNumbered(
                    pack.Serial[r],
                    pack.EndedTicks[r],
                    pack.Verdict[r],
                    number[pack.Station[r]],
                    pack.Slot[r],
                    pack.Lot[r] < 0 ? -1 : number[pack.Lot[r]],
                    number[pack.Sequence[r]],
                    pack.Revision[r],
                    pack.Failure[r] < 0 ? -1 : number[pack.Failure[r]],
                    pack.Reason[r] < 0 ? -1 : number[pack.Reason[r]]);
                if (_operators)
                {
                    runs.SetOperator(run, pack.Text(pack.Operator[r]));
                }
            }
        }

        private void PlaceReadings(MonthRuns month, int first)
        {
            // Per pack and sequence (a pack mostly holds one), the series of each shape once asked for.
            var series = month.Packs.Select(_ => new Dictionary<int, ReadingSeries?[]>()).ToArray();
            var before = data.Readings.ToDictionary(s => s, s => s.Count);
            var wantsShape = month.Packs.Select(p => p.Shapes.Select(s => query.WantsReading(p.Texts[s.Name])).ToArray()).ToArray();
            for (var position = 0; position < month.Order.Length; position++)
            {
                var key = month.Order[position];
                var run = first + position;
                var (p, r) = ((int)(key >> 32), (int)key);
                var pack = month.Packs[p];
                if (!series[p].TryGetValue(pack.Sequence[r], out var ofShape))
                {
                    ofShape = new ReadingSeries?[pack.Shapes.Length];
                    series[p].Add(pack.Sequence[r], ofShape);
                }

                for (var i = pack.ReadingStart[r]; i < pack.ReadingStart[r + 1]; i++)
                {
                    var s = pack.ReadingShape[i];
                    if (!wantsShape[p][s])
                    {
                        continue;
                    }

                    var shape = pack.Shapes[s];
                    var into = ofShape[s] ??= data.Series(pack.Texts[pack.Sequence[r]], pack.Texts[shape.Name], pack.Texts[shape.Unit]);
                    var value = pack.ReadingValue[i];
                    into.Add(run, double.IsNaN(value) ? null : value, pack.Texts[shape.Unit], shape.Low, shape.High);
                }
            }

            ReserveForLaterMonths(before);
        }

        /// <summary>
        /// Makes room in each series for the months still to come, as many values per packed run as this month gave it:
        /// a series of a million values is then allocated about once instead of doubling its way there (each doubling a
        /// new large array to fill and the old one to copy). Over all series this is about as many values as the months
        /// hold, so a series that stops early costs little room; one that grows later grows as before.
        /// </summary>
        private void ReserveForLaterMonths(Dictionary<ReadingSeries, int> before)
        {
            var thisMonth = monthRuns[_month];
            long later = 0;
            for (var m = _month + 1; m < monthRuns.Length; m++)
            {
                later += monthRuns[m];
            }

            if (thisMonth <= 0 || later <= 0)
            {
                return;
            }

            foreach (var s in data.Readings)
            {
                var added = s.Count - before.GetValueOrDefault(s);
                var wanted = s.Count + (long)Math.Ceiling(added * (double)later / thisMonth);
                if (added > 0 && wanted <= int.MaxValue / 16)
                {
                    s.EnsureCapacity((int)wanted);
                }
            }
        }
    }
}
