using LineTest.Core.Fixtures;
using LineTest.Rig.Simulation;

namespace LineTest.Rig.Tests.Simulation;

/// <summary>Fixture definitions and clocks for simulator tests (invented demo values).</summary>
internal static class SimulatedFixtures
{
    public static readonly DateTimeOffset Start = new(2026, 3, 16, 6, 0, 0, TimeSpan.Zero);

    public static SourceDefinition Source(double standbyC = 23) => new()
    {
        SafeMinC = -30,
        SafeMaxC = 140,
        StandbyC = standbyC,
        RampUpCPerMinute = 10,
        RampDownCPerMinute = 6,
        SettlingTimeConstantSeconds = 30,
    };

    public static SimulationDefinition Simulation(double blockNoiseC = 0.002, double defectRate = 0.04, double unitNoiseVolts = 0.00005, double sensorDefectRate = 0.006) => new()
    {
        BlockNoiseC = blockNoiseC,
        DefectRate = defectRate,
        SensorDefectRate = sensorDefectRate,
        UnitOutputNoiseVolts = unitNoiseVolts,
        SlotOffsetsC = [0.01, -0.02, 0.015, 0.0],
    };

    /// <summary>A four-well dry block: slot n reads on channel n, its supply shunt on channel 100 + n.</summary>
    public static FixtureDefinition FourWellBlock(SimulationDefinition? simulation = null) => new()
    {
        Id = "demo-block-4",
        Source = Source(),
        Reference = new ReferenceDefinition
        {
            Sensor = new ReferenceSensorDefinition { Kind = "celsius" },
            ReadoutResolution = 0.0001,
        },
        Meter = new MeterDefinition(),
        Slots = Enumerable.Range(1, 4).Select(n => new SlotDefinition { Slot = n, OutputChannel = n, SupplyChannel = 100 + n }).ToList(),
        Simulation = simulation ?? Simulation(),
    };

    /// <summary>A readout that reports °C: the raw quantity is the temperature itself.</summary>
    public static double CelsiusReadout(double celsius) => celsius;

    public static VirtualTimeProvider Clock() => new(Start);

    public static SimulatedRig Rig(int seed = 7, SimulationDefinition? simulation = null, VirtualTimeProvider? clock = null)
        => new(FourWellBlock(simulation), seed, clock ?? Clock(), CelsiusReadout);

    public static SimulatedUnitFactory Factory(int seed = 11, SimulationDefinition? simulation = null, SimulatedUnitDesign? design = null)
        => new(seed, simulation ?? Simulation(), design ?? SimulatedUnitDesign.Ctp40A);
}
