namespace LineTest.Rig.Serial.Tests;

/// <summary>A theory that needs real pseudo-terminal serial ports, which only Linux provides here.</summary>
public sealed class LinuxTheoryAttribute : TheoryAttribute
{
    public LinuxTheoryAttribute()
    {
        if (!OperatingSystem.IsLinux())
        {
            Skip = "needs Linux pseudo-terminals (posix_openpt) to stand in for serial ports";
        }
    }
}
